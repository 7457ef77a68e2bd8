// Lint rules for the whole repository. Type-aware rules stay off so the lint is fast;
// `npm run typecheck` is the type gate.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/**', 'dist/**', 'ui/dist/**', 'coverage/**', 'test-output/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/consistent-type-imports': 'error',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
      eqeqeq: ['error', 'always'],
      'no-console': 'off',
    },
  },
  {
    files: ['**/*.js'],
    languageOptions: { globals: { process: 'readonly', console: 'readonly' } },
  },
  {
    files: ['core/**/*.ts'],
    rules: {
      // core/ is deterministic: no clock and no global randomness.
      'no-restricted-properties': [
        'error',
        { object: 'Math', property: 'random', message: 'core/ takes a seeded generator.' },
        { object: 'Date', property: 'now', message: 'core/ has no clock; pass the date in.' },
      ],
      'no-restricted-globals': ['error', 'process', 'window', 'document', 'fetch'],
    },
  },
);
