// Lint rules for the whole repository: TypeScript everywhere, Vue single-file components in src/.
// Formatting is Prettier's job (eslint-config-prettier turns off the rules that would fight it).
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import vue from 'eslint-plugin-vue';
import globals from 'globals';
import tseslint from 'typescript-eslint';

export default tseslint.config(
  { ignores: ['node_modules/', 'dist/', 'data/', 'test-results/', 'playwright-report/', '.tmp/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  ...vue.configs['flat/recommended'],
  {
    files: ['**/*.vue'],
    languageOptions: { parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.vue'] } },
  },
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      // TypeScript checks names itself; the core rule does not know DOM and Node types.
      'no-undef': 'off',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none', ignoreRestSiblings: true },
      ],
      'no-restricted-globals': ['error', { name: 'fetch', message: 'Only src/api/http.ts calls fetch.' }],
    },
  },
  {
    files: ['src/api/http.ts', 'tests/**', 'server/**', 'seed/**'],
    rules: { 'no-restricted-globals': 'off' },
  },
  prettier,
);
