import fs from 'node:fs';
import js from '@eslint/js';
import { createTypeScriptImportResolver } from 'eslint-import-resolver-typescript';
import importX from 'eslint-plugin-import-x';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/** Each client feature may use its own folder, the app's shared parts and shared/, never another feature. */
const features = fs.readdirSync('src/features');
const featureZones = features.map((feature) => ({
  target: `./src/features/${feature}`,
  from: './src/features',
  except: [`./${feature}`],
  message:
    'A feature does not import another feature: move what both need to src/components, src/lib or shared/.',
}));

/**
 * The layout, held by lint: the client and the server never import each other; shared/ imports
 * neither; features stay apart and never reach up into the app shell; the app's shared parts
 * import no feature; on the server, adapters (db, mail, storage, jobs) and the statistics import
 * no module. And no import cycle anywhere.
 */
const boundaries = {
  files: ['src/**/*.{ts,tsx}', 'server/**/*.ts', 'shared/**/*.ts'],
  plugins: { 'import-x': importX },
  settings: {
    'import-x/resolver-next': [createTypeScriptImportResolver({ project: './tsconfig.json' })],
  },
  rules: {
    'import-x/no-cycle': ['error', { ignoreExternal: true }],
    'import-x/no-restricted-paths': [
      'error',
      {
        zones: [
          {
            target: './src',
            from: './server',
            message: 'The client never imports server code: share it through shared/.',
          },
          {
            target: './server',
            from: './src',
            message: 'The server never imports client code: share it through shared/.',
          },
          {
            target: './shared',
            from: ['./src', './server'],
            message: 'shared/ is pure code both sides use: it imports neither.',
          },
          ...featureZones,
          {
            target: './src/features',
            from: './src/app',
            message: 'Features never import the app shell; the app composes features.',
          },
          {
            target: ['./src/components', './src/lib'],
            from: ['./src/features', './src/app'],
            message: "The app's shared parts import no feature and not the app shell.",
          },
          {
            target: [
              './server/db',
              './server/mail',
              './server/storage',
              './server/jobs',
              './server/stats',
              './server/http',
              './server/csv',
            ],
            from: './server/modules',
            message:
              'Adapters and the statistics import no module: a module uses them, never the other way round.',
          },
        ],
      },
    ],
  },
};

export default tseslint.config(
  { ignores: ['dist/', 'build/', 'node_modules/', '.data/', 'uploads/', 'coverage/'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    files: ['**/*.{ts,tsx,mjs,js}'],
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      '@typescript-eslint/consistent-type-imports': 'error',
      // Beyond a folder's neighbour, import through the package.json "imports" aliases
      // (#server/…, #shared/…, #src/…, #migrations/…, #tests/…), never by climbing.
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex: '^(\\.\\./){2,}',
              message:
                "Use an alias from package.json's \"imports\" (e.g. #server/db/database) instead of '../../'.",
            },
          ],
        },
      ],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: reactHooks.configs.recommended.rules,
  },
  boundaries,
  {
    files: ['migrations/**/*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
);
