import { readdirSync } from 'node:fs';
import js from '@eslint/js';
import importX, { createNodeResolver } from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

const FRAMEWORKS = ['express', 'express-*', 'sequelize', 'pg', 'react', 'react-*', '@tanstack/*', 'pino', 'node:*'];

// Web features stand side by side: each imports shared/, web/src/components and web/src/lib,
// never another feature; only web/src/app composes them (bulletproof-react's unidirectional
// imports). A piece two features need moves down to components/ or lib/.
const WEB_FEATURES = readdirSync(new URL('./web/src/features', import.meta.url), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);
const WEB_LAYER_ZONES = [
  ...WEB_FEATURES.map((feature) => ({
    target: `./web/src/features/${feature}`,
    from: './web/src/features',
    except: [`./${feature}`],
    message: `web/src/features/${feature} must not import another feature: move what both need to web/src/components or web/src/lib.`,
  })),
  { target: './web/src/features', from: './web/src/app', message: 'Features must not import the app: the app composes features.' },
  {
    target: ['./web/src/components', './web/src/lib'],
    from: './web/src/features',
    message: 'components/ and lib/ sit below the features: they import no feature.',
  },
];

// Write services take the unit of work's instant: only the edge reads the clock (services/unit-of-work.ts).
const CLOCK_READS = [
  { selector: "NewExpression[callee.name='Date'][arguments.length=0]", message: 'Services never read the clock: use uow.now (or take the instant as a parameter).' },
  { selector: "CallExpression[callee.object.name='Date'][callee.property.name='now']", message: 'Services never read the clock: use uow.now (or take the instant as a parameter).' },
];

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
            ...WEB_LAYER_ZONES,
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
    files: ['api/src/services/**/*.ts'],
    ignores: ['api/src/services/unit-of-work.ts'],
    rules: {
      // (an HTTP status cannot even be named: AppError takes a code, and the error middleware maps it)
      'no-restricted-syntax': ['error', ...CLOCK_READS],
    },
  },
  {
    files: ['web/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
);
