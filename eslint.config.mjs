// ESLint flat config: Next.js core-web-vitals and TypeScript rule sets, plus the
// project's generated and local-data folders ignored.
import { defineConfig, globalIgnores } from 'eslint/config';
import nextVitals from 'eslint-config-next/core-web-vitals';
import nextTs from 'eslint-config-next/typescript';

const eslintConfig = defineConfig([
  ...nextVitals,
  ...nextTs,
  {
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
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
