import js from '@eslint/js';
import importX, { createNodeResolver } from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const FRAMEWORKS = ['express', 'express-*', 'sequelize', 'pg', 'react', 'react-*', '@tanstack/*', 'pino', 'node:*'];

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.data/**', 'coverage/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    plugins: { 'import-x': importX },
    settings: {
      'import-x/resolver-next': [createNodeResolver({ extensions: ['.ts', '.tsx', '.js', '.json'] })],
    },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/no-namespace': ['error', { allowDeclarations: true }],
      // api/ and web/ meet only in shared/; shared/ knows neither
      'import-x/no-restricted-paths': [
        'error',
        {
          zones: [
            { target: './api', from: './web', message: 'api/ must not import web/: share through shared/.' },
            { target: './web', from: './api', message: 'web/ must not import api/: share through shared/.' },
            { target: './shared', from: ['./api', './web', './infra'], message: 'shared/ is pure: it imports neither side.' },
          ],
        },
      ],
    },
  },
  {
    files: ['shared/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [{ group: FRAMEWORKS, message: 'shared/ is pure TypeScript: no framework or I/O imports.' }] },
      ],
    },
  },
  {
    files: ['web/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
);
