/**
 * ESLint (flat config): typescript-eslint's recommended rules, the Office add-in rules of
 * eslint-plugin-office-addins for the code that calls Office.js, and the project's line limit (160 characters).
 * Formatting itself is Prettier's (`npm run format:check`); this config turns off the rules it would fight.
 * `npm run lint` runs it; `npm test` runs it first.
 */
const js = require('@eslint/js');
const tseslint = require('typescript-eslint');
const officeAddins = require('eslint-plugin-office-addins');
const prettierOff = require('eslint-config-prettier');

// Long prose in string and template literals (messages, README-like text in demo workbooks) may run on; code may not.
const MAX_LEN = ['error', { code: 160, ignoreUrls: true, ignoreRegExpLiterals: true, ignoreStrings: true, ignoreTemplateLiterals: true }];

module.exports = tseslint.config(
  { ignores: ['dist/**', 'build/**', 'docs/**', 'coverage/**', 'demo-output/**', 'screenshots/**', 'node_modules/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  prettierOff,
  {
    files: ['**/*.ts'],
    languageOptions: { parserOptions: { ecmaVersion: 2022, sourceType: 'module' } },
    rules: {
      'max-len': MAX_LEN,
      'no-eval': 'error',
      // Worksheet functions take Excel's cells as any (functions.json is generated from these signatures).
      '@typescript-eslint/no-explicit-any': 'off',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
    },
  },
  {
    // The code that calls Office.js: the Office add-in rules (load before read, sync after load, no sync in loops, ...).
    files: ['src/workbook/**/*.ts', 'src/taskpane/**/*.ts', 'src/functions/**/*.ts'],
    plugins: { 'office-addins': officeAddins },
    rules: {
      'office-addins/call-sync-after-load': 'error',
      'office-addins/call-sync-before-read': 'error',
      'office-addins/load-object-before-read': 'error',
      'office-addins/no-context-sync-in-loop': 'warn',
      'office-addins/no-empty-load': 'error',
      'office-addins/no-navigational-load': 'warn',
      'office-addins/no-office-initialize': 'error',
      'office-addins/test-for-null-using-isNullObject': 'error',
    },
  },
  {
    // Tests and the mock stand in for Office and Excel, and reach into modules with require() for jest's mocks.
    files: ['test/**/*.ts', 'bench/**/*.ts'],
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  {
    files: ['**/*.js'],
    languageOptions: {
      sourceType: 'commonjs',
      globals: {
        require: 'readonly',
        module: 'writable',
        __dirname: 'readonly',
        process: 'readonly',
        console: 'readonly',
        Buffer: 'readonly',
        URL: 'readonly',
        globalThis: 'readonly',
      },
    },
    rules: { 'max-len': MAX_LEN, '@typescript-eslint/no-require-imports': 'off' },
  },
);
