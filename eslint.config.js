import js from '@eslint/js';
import boundaries from 'eslint-plugin-boundaries';
import globals from 'globals';
import reactHooks from 'eslint-plugin-react-hooks';
import reactRefresh from 'eslint-plugin-react-refresh';
import tseslint from 'typescript-eslint';

/**
 * The architecture's boundaries, checked on every import (docs/decisions/006-boundaries-in-the-linter.md).
 * Each element is a folder of the tree; a dependency between elements is allowed unless a policy
 * below refuses it, and each refusal says what to do instead.
 */
const architecture = {
  plugins: { boundaries },
  settings: {
    'import/resolver': {
      typescript: {
        project: [
          'apps/web/tsconfig.json',
          'apps/server/tsconfig.json',
          'packages/*/tsconfig.json',
          'tsconfig.tools.json',
        ],
        noWarnOnMultipleProjects: true,
      },
    },
    'boundaries/include': ['apps/*/src/**/*', 'packages/*/src/**/*'],
    'boundaries/elements': [
      { type: 'web-app', pattern: 'apps/web/src/app' },
      { type: 'web-feature', pattern: 'apps/web/src/features/*', capture: ['feature'] },
      {
        type: 'web-shared',
        pattern: ['apps/web/src/components', 'apps/web/src/lib', 'apps/web/src/config'],
      },
      { type: 'server-db', pattern: 'apps/server/src/db' },
      { type: 'server-images', pattern: 'apps/server/src/lib/images' },
      { type: 'server-email', pattern: 'apps/server/src/lib/email' },
      { type: 'server-pdf', pattern: 'apps/server/src/lib/pdf' },
      { type: 'server-xlsx', pattern: 'apps/server/src/lib/xlsx' },
      { type: 'server-module', pattern: 'apps/server/src/modules/*', capture: ['module'] },
      { type: 'server', pattern: 'apps/server/src' },
      { type: 'package', pattern: 'packages/*', capture: ['package'] },
    ].map((element) => ({ ...element, partialMatch: false })),
    'boundaries/files': [
      { category: 'repository', pattern: '**/*.repository.ts' },
      { category: 'routes', pattern: '**/*.routes.ts' },
      { category: 'test', pattern: '**/*.test.ts' },
      // Every file has a category, so that "none of these categories" matches a plain file.
      { category: 'source', pattern: '**/*' },
    ],
  },
  rules: {
    'boundaries/dependencies': [
      'error',
      {
        default: 'allow',
        checkAllOrigins: true,
        checkInternals: true,
        policies: [
          {
            from: { element: { type: 'web-feature' } },
            disallow: {
              to: {
                element: {
                  type: 'web-feature',
                  captured: { feature: '!{{ from.element.captured.feature }}' },
                },
              },
            },
            message:
              'A feature never imports another feature: move what both use to components/ or lib/, or compose them in app/',
          },
          {
            from: { element: { type: 'web-shared' } },
            disallow: { to: { element: { types: { anyOf: ['web-feature', 'web-app'] } } } },
            message:
              'components/, lib/ and config/ are shared by every feature and import none of them: take what a feature knows (its URLs, its API) as an argument',
          },
          {
            from: {
              element: { types: { noneOf: ['server-db'] } },
              file: { categories: { noneOf: ['repository'] } },
            },
            disallow: { to: { module: { source: ['drizzle-orm', 'better-sqlite3'] } } },
            message: 'Drizzle and SQLite only in a *.repository.ts or in db/: call a repository',
          },
          {
            from: { element: { types: { noneOf: ['server-images'] } } },
            disallow: { to: { module: { source: 'sharp' } } },
            message: 'Only lib/images calls sharp: add what you need there',
          },
          {
            from: { element: { types: { noneOf: ['server-pdf'] } } },
            disallow: { to: { module: { source: 'pdfmake' } } },
            message: 'Only lib/pdf calls pdfmake: hand it a document definition',
          },
          {
            from: {
              element: { types: { noneOf: ['server-xlsx'] } },
              file: { categories: { noneOf: ['test'] } },
            },
            disallow: { to: { module: { source: 'exceljs' } } },
            message: 'Only lib/xlsx writes workbooks (exceljs): hand it a header and rows',
          },
          {
            from: { element: { types: { noneOf: ['server-email'] } } },
            disallow: { to: { module: { source: 'nodemailer' } } },
            message:
              'Only lib/email talks SMTP: queue a message with queueMail in the transaction of the change',
          },
          {
            from: { element: { types: { noneOf: ['server-email'] } } },
            disallow: {
              to: {
                element: { type: 'server-email' },
                file: { path: '**/lib/email/{mailer,delivery}.ts' },
              },
            },
            message:
              'Modules never send directly: queue a message with queueMail (lib/email/outbox.ts); the delivery worker sends it',
          },
          {
            // The runtime is where the mailer and its worker are made and started.
            from: { file: { path: 'apps/server/src/bootstrap.ts' } },
            allow: { to: { element: { type: 'server-email' } } },
          },
          {
            from: { element: { type: 'server-module' } },
            disallow: {
              to: {
                module: {
                  origin: 'core',
                  source: ['fs', 'node:fs', 'fs/promises', 'node:fs/promises'],
                },
              },
            },
            message: 'Modules do no file work: files go through lib/storage (or lib/images)',
          },
          {
            from: { file: { categories: 'routes' } },
            disallow: { to: { file: { categories: 'repository' } } },
            message: 'Routes call services, never repositories',
          },
        ],
      },
    ],
  },
};

// Roles and organisations are checked through permissions.ts and http/record-access.ts only.
const accessChecks = [
  {
    selector:
      "BinaryExpression[operator=/^[!=]==?$/]:matches([left.property.name='role'][right.type='Literal'], [left.name='role'][right.type='Literal'], [right.property.name='role'][left.type='Literal'], [right.name='role'][left.type='Literal'])",
    message:
      'Check what a role may do with can() or organisationKindOf() from permissions.ts, never by its name',
  },
  {
    selector: "MemberExpression[object.property.name='user'][property.name='organisationId']",
    message:
      "Scope records to the caller's organisation through http/record-access.ts (recordScope, seesOrganisationRecord, seesInspection)",
  },
];

export default tseslint.config(
  {
    ignores: [
      '**/dist/**',
      '**/node_modules/**',
      'data/**',
      'test-results/**',
      'playwright-report/**',
      'apps/server/src/db/migrations/**',
      'tests/lint/fixtures/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/consistent-type-imports': 'error',
      'no-console': ['error', { allow: ['warn', 'error'] }],
    },
  },
  {
    files: ['apps/web/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks, 'react-refresh': reactRefresh },
    rules: {
      ...reactHooks.configs.recommended.rules,
      'react-refresh/only-export-components': ['warn', { allowConstantExport: true }],
    },
  },
  {
    // Product code only: tests make their own images with sharp and read files back.
    files: ['apps/*/src/**/*.{ts,tsx}'],
    ignores: ['**/*.test.ts'],
    ...architecture,
  },
  {
    files: ['apps/*/src/**/*.{ts,tsx}'],
    ignores: ['**/*.test.ts', 'apps/server/src/http/record-access.ts'],
    rules: { 'no-restricted-syntax': ['error', ...accessChecks] },
  },
  {
    // Shared web code knows no feature's address: a feature builds its URLs through apiUrl in its
    // own api/ file and hands them over (the upload queue is given each file's URL).
    files: ['apps/web/src/{lib,components,config}/**/*.{ts,tsx}'],
    ignores: ['apps/web/src/lib/api-client.ts'],
    rules: {
      // The access checks again: a later block's rule replaces an earlier one's, it does not add.
      'no-restricted-syntax': [
        'error',
        ...accessChecks,
        {
          selector: 'Literal[value=/^\\/api\\//], TemplateElement[value.raw=/^\\/api\\//]',
          message:
            'Shared code holds no API address: build it in the feature’s api/ file (apiUrl) and pass it in',
        },
      ],
    },
  },
  {
    // Pure domain packages: no I/O, no framework.
    files: ['packages/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: ['node:*', 'fs', 'path', 'express', 'react', 'drizzle-orm*', 'better-sqlite3'],
        },
      ],
    },
  },
  {
    // Scripts, tests and the command-line tools speak on the console.
    files: ['scripts/**', 'tests/**', 'apps/server/src/cli/**'],
    rules: { 'no-console': 'off' },
  },
);
