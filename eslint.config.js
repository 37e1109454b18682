// Lint rules for the whole repository (run by `npm test` before the test suite, and by `npm run lint`).
// typescript-eslint's recommended rules that need no type information, plus a few that catch real mistakes.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', 'out/', 'bin/', 'coverage/'] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    languageOptions: {
      ecmaVersion: 2022,
      sourceType: 'module',
      globals: {
        // Node, browser and worker globals used across src/, web/, scripts/ and tests/.
        console: 'readonly', process: 'readonly', Buffer: 'readonly', URL: 'readonly', TextDecoder: 'readonly',
        TextEncoder: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly', setInterval: 'readonly',
        clearInterval: 'readonly', queueMicrotask: 'readonly', performance: 'readonly', structuredClone: 'readonly',
        window: 'readonly', document: 'readonly', self: 'readonly', Worker: 'readonly', Blob: 'readonly',
        File: 'readonly', FileReader: 'readonly', navigator: 'readonly', requestAnimationFrame: 'readonly',
        HTMLElement: 'readonly', HTMLCanvasElement: 'readonly', MessageEvent: 'readonly', AbortController: 'readonly',
      },
    },
    rules: {
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      'no-var': 'error',
      'prefer-const': 'error',
      'no-self-compare': 'error',
      'no-constant-binary-expression': 'error',
      'no-unused-vars': 'off',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' }],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      '@typescript-eslint/no-non-null-assertion': 'off',
      // one import style: relative imports without an extension (node scripts/fix-import-style.mjs rewrites them)
      'no-restricted-imports': [
        'error',
        { patterns: [{ regex: '^\\.{1,2}/.*\\.js$', message: 'write relative imports without .js (run node scripts/fix-import-style.mjs)' }] },
      ],
    },
  },
  {
    // The analysis core computes exp and log with src/numeric/det-math.ts, so the viewer's numbers match the CLI's
    // bit for bit (engines may round Math.exp / Math.log differently). The simulator is not part of that parity.
    files: ['src/**/*.ts'],
    ignores: ['src/simulate/**', 'src/numeric/det-math.ts'],
    rules: {
      'no-restricted-properties': [
        'error',
        { object: 'Math', property: 'exp', message: 'use detExp from src/numeric/det-math.ts (same bits in every engine)' },
        { object: 'Math', property: 'log', message: 'use detLog from src/numeric/det-math.ts (same bits in every engine)' },
      ],
    },
  },
);
