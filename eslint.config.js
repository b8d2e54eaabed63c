// The linter's rules, and the import boundaries that keep each layer in its place:
// shared → features → app on the client, server domains → db on the server.
import js from '@eslint/js';
import prettier from 'eslint-config-prettier';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';
import tseslint from 'typescript-eslint';

/** Names an import that a folder may not make, and why. */
function forbid(group, message) {
  return { group, message };
}

const noIO = [
  forbid(
    ['express', 'typeorm', 'mysql2', 'mysql2/*', 'nodemailer', 'multer', 'node:*', 'fs', 'path'],
    'shared/ does no I/O.',
  ),
  forbid(['react', 'react-dom', 'react-*', '@tanstack/*'], 'shared/ uses no framework.'),
  forbid(
    ['**/src/**', '../../src/*', '**/server/**'],
    'shared/ imports neither the client nor the server.',
  ),
];
const clientNeverServer = forbid(
  ['**/server/**', '../../server/*', '../../../server/*'],
  'The client never imports server code; share it through shared/.',
);
const notTheApp = forbid(
  ['**/app/**', '../app/*', '../../app/*', '../../../app/*'],
  'Only src/app composes features; nothing below it imports it.',
);
const notAFeature = forbid(
  ['**/features/**', '../features/*', '../../features/*'],
  'Shared client code does not know the features built on it.',
);
const persistence = forbid(
  ['typeorm', 'typeorm/*', 'mysql2', 'mysql2/*'],
  'TypeORM and the driver stay inside repositories and server/db (see DEVELOPERS.md).',
);

export default tseslint.config(
  { ignores: ['dist/**', 'node_modules/**', '.data/**', 'coverage/**', 'protocols/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrors: 'none' },
      ],
      '@typescript-eslint/consistent-type-imports': [
        'error',
        { fixStyle: 'inline-type-imports', disallowTypeAnnotations: false },
      ],
      'no-restricted-syntax': [
        'error',
        { selector: 'TSEnumDeclaration', message: 'Use a union of string literals.' },
      ],
      eqeqeq: ['error', 'always', { null: 'ignore' }],
    },
  },
  {
    files: ['src/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
  { files: ['shared/**/*.ts'], rules: { 'no-restricted-imports': ['error', { patterns: noIO }] } },
  {
    files: ['src/**/*.{ts,tsx}'],
    ignores: ['src/app/**', 'src/components/**', 'src/lib/**', 'src/config/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [clientNeverServer, notTheApp] }] },
  },
  {
    files: ['src/components/**', 'src/lib/**', 'src/config/**'],
    rules: {
      'no-restricted-imports': ['error', { patterns: [clientNeverServer, notTheApp, notAFeature] }],
    },
  },
  {
    files: ['src/app/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [clientNeverServer] }] },
  },
  {
    // A domain's routes and services see plain objects; persistence is the repositories' business.
    files: ['server/**/*.ts'],
    ignores: [
      'server/db/**',
      'server/**/*repository.ts',
      'server/**/unit-of-work.ts',
      'server/ops/**',
      'server/demo/**',
    ],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [persistence, forbid(['**/src/**'], 'The server never imports the client.')] },
      ],
    },
  },
  {
    files: ['server/db/**/*.ts'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              regex:
                '^(\\.\\./)+(attachments|audit|auth|calculations|health|http|mail|orders|patients|people|pharmacy|protocols|review|sessions|today|staff)(/|$)',
              message: 'server/db knows no domain: domains depend on it, not the reverse.',
            },
          ],
        },
      ],
    },
  },
  {
    files: ['tests/**', 'server/ops/**', 'server/demo/**', '*.config.*', '*.ts'],
    rules: { '@typescript-eslint/no-explicit-any': 'off' },
  },
  prettier,
);
