// The one zod import of the app: zod with its just-in-time compiled object parsers off.
// zod 4 probes for them with `Function("")`, which the Content-Security-Policy (no
// 'unsafe-eval', lib/http/security-headers.mjs) blocks and reports as a violation in
// every browser that loads a form. The probe runs when the first object schema is
// built, so the setting must come before any schema: every module that builds schemas
// imports z from here (eslint's no-restricted-imports keeps it so). The interpreted
// parser is fast enough for forms and request bodies.
import { z } from 'zod';

z.config({ jitless: true });

export { z };
