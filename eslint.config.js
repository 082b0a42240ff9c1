// ESLint flat config: the recommended JavaScript, TypeScript and React-hooks rules, plus the import
// boundaries of DEVELOPERS.md ("imports flow one way"): stats/ and schema/ use nothing from the app, and
// the browser and the server never import each other. Type checking itself is `npm run typecheck`.
import js from '@eslint/js';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const boundary = (from, patterns) => ({
  files: from,
  rules: {
    'no-restricted-imports': ['error', { patterns: patterns.map((group) => ({ group: [group], message: 'Imports flow one way (DEVELOPERS.md, "Layout").' })) }],
  },
});

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', 'bench-results/**', 'data/**', 'tests/e2e/screenshots/**', 'backend/src/db/migrations/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      // Unused names are errors, except those marked unused on purpose with a leading underscore.
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      // Test helpers and chart props use `any` where third-party types are loose; the compiler's strict mode stays on.
      '@typescript-eslint/no-explicit-any': 'off',
      eqeqeq: ['error', 'smart'],
      'no-console': ['error', { allow: ['warn', 'error'] }],
    },
  },
  {
    files: ['frontend/**/*.{ts,tsx}'],
    ...reactHooks.configs.flat['recommended-latest'],
    rules: {
      ...reactHooks.configs.flat['recommended-latest'].rules,
      // These three advise code for the React Compiler, which this app does not use; rules-of-hooks and
      // exhaustive-deps stay on.
      'react-hooks/refs': 'off',
      'react-hooks/set-state-in-effect': 'off',
      'react-hooks/incompatible-library': 'off',
    },
  },
  {
    files: ['backend/src/cli/**', 'tests/**', 'backend/src/db/seed-*.ts', 'backend/src/db/migrate-cli.ts', 'backend/src/server.ts'],
    rules: { 'no-console': 'off' },
  },
  boundary(['stats/**', 'schema/**'], ['**/backend/**', '**/frontend/**', '@frontend/*', 'better-sqlite3', 'express']),
  boundary(['stats/**'], ['**/schema/**', '@schema/*']),
  boundary(['frontend/**'], ['**/backend/**', 'better-sqlite3', 'express', 'node:*']),
  boundary(['backend/**'], ['**/frontend/**', '@frontend/*']),
);
