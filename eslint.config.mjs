// ESLint flat config: Next.js core-web-vitals and TypeScript rule sets, plus the
// project's generated and local-data folders ignored, and the boundaries of lib/ enforced:
// nothing under lib/ imports app/ or components/, and the engine (lib/gcode, lib/kinematics,
// lib/analysis, lib/estimate) imports no React, Next, db/ or Node-only module, so the same
// code runs in the browser worker, a Node worker thread and the CLI.
import { builtinModules } from 'node:module';
import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

// zod comes configured from lib/validation/zod.ts (no eval probe under the CSP)
const ZOD = { name: 'zod', message: "Import { z } from '@/lib/validation/zod'." };
const LIB_PATTERNS = [
  { regex: '^(@/|(\\.\\./)+)(app|components)(/|$)', message: 'lib/ is used by app/ and components/, never the other way round.' },
];
const ENGINE = 'the engine (lib/gcode, lib/kinematics, lib/analysis, lib/estimate) runs in the browser worker, a Node worker thread and the CLI';
const ENGINE_PATTERNS = [
  ...LIB_PATTERNS,
  { regex: '^(react|react-dom|next|next-auth|server-only|drizzle-orm|mysql2)(/|$)', message: `No React, Next or server-only packages: ${ENGINE}.` },
  { regex: '^(@/|(\\.\\./)+)db(/|$)', message: `No db/: ${ENGINE}; the caller reads and stores.` },
  { regex: `^(node:.*|(${builtinModules.filter((m) => !m.startsWith('_')).map((m) => m.replace(/[/]/g, '\\/')).join('|')})(/.*)?)$`, message: `No Node-only modules: ${ENGINE}.` },
];

const eslintConfig = defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-restricted-imports': ['error', { paths: [ZOD] }],
    },
  },
  {
    files: ['lib/**/*.{ts,tsx,mts,mjs}'],
    rules: {
      'no-restricted-imports': ['error', { paths: [ZOD], patterns: LIB_PATTERNS }],
      // one name, one meaning in a scope: a shadowed name was a source of misreadings in the engine
      'no-shadow': 'off',
      '@typescript-eslint/no-shadow': 'error',
    },
  },
  {
    files: ['lib/{gcode,kinematics,analysis,estimate}/**/*.{ts,tsx,mts,mjs}'],
    rules: { 'no-restricted-imports': ['error', { paths: [ZOD], patterns: ENGINE_PATTERNS }] },
  },
  { files: ['lib/validation/zod.ts'], rules: { 'no-restricted-imports': 'off' } },
  globalIgnores([
    '.next/**',
    'out/**',
    'build/**',
    'coverage/**',
    '.data/**',
    'node_modules/**',
    'next-env.d.ts',
    'fixtures/programs/generated/**',
  ]),
]);

export default eslintConfig;
