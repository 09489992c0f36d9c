// Lint rules for reflap: a small set, syntax-only (no type information, so `npm run lint` stays fast on CI).
// Types are tsc's job (`npm run typecheck`), layout is Prettier's, import direction is checked by a test.

import { defineConfig } from 'eslint/config';
import tseslint from 'typescript-eslint';

export default defineConfig(
  {
    ignores: ['dist/', 'node_modules/', 'out/', 'test-output/'],
  },
  {
    files: ['**/*.ts', '**/*.js'],
    languageOptions: {
      parser: tseslint.parser,
      ecmaVersion: 2022,
      sourceType: 'module',
    },
    plugins: { '@typescript-eslint': tseslint.plugin },
    linterOptions: { reportUnusedDisableDirectives: 'error' },
    rules: {
      // Dead code hides what a module does; a leading underscore marks a parameter kept for its position.
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
      // `any` switches the type checker off; data from outside is `unknown` until a reader has validated it.
      '@typescript-eslint/no-explicit-any': 'error',
      // Type-only imports say so, and vanish from the compiled JavaScript whatever the compiler settings.
      '@typescript-eslint/consistent-type-imports': 'error',
      // Loose equality converts types behind the reader's back.
      eqeqeq: 'error',
      // A binding that is never reassigned reads as a constant.
      'prefer-const': 'error',
      // Block scope only; `var` hoists across the function.
      'no-var': 'error',
    },
  },
  {
    files: ['src/**/*.ts'],
    ignores: ['src/cli/**'],
    rules: {
      // The library prints nothing: results go back to the caller, output is the CLI's job.
      'no-console': 'error',
    },
  },
);
