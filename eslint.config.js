// Lint configuration. The rule that matters most: core/ stays pure (no electron, svelte,
// leaflet, better-sqlite3 or node:* imports), except its command-line entry in core/cli/.
import tseslint from 'typescript-eslint';
import svelte from 'eslint-plugin-svelte';
import globals from 'globals';

/** No room below another: core imports nothing from data/, electron/ or renderer/ (the CLI included). */
const otherRooms = {
  group: ['data', 'electron', 'renderer'].flatMap((room) => [
    `../${room}/*`,
    `../../${room}/*`,
    `../../../${room}/*`,
  ]),
  message: 'core/ imports no other room (the demo lot is in core/demo/).',
};

const impureModules = {
  patterns: [
    { group: ['electron', 'electron/*'], message: 'core/ is pure: no electron.' },
    { group: ['svelte', 'svelte/*', '*.svelte'], message: 'core/ is pure: no svelte.' },
    { group: ['leaflet', 'leaflet/*', '@geoman-io/*'], message: 'core/ is pure: no leaflet.' },
    { group: ['better-sqlite3'], message: 'core/ is pure: no sqlite.' },
    { group: ['node:*'], message: 'core/ is pure: node:* only in core/cli/.' },
    {
      group: ['fs', 'path', 'os', 'child_process', 'worker_threads', 'http', 'https', 'net', 'url'],
      message: 'core/ is pure: no Node built-ins.',
    },
    otherRooms,
  ],
};

export default tseslint.config(
  {
    ignores: [
      'node_modules/**',
      'dist/**',
      '.cache/**',
      'test-results/**',
      'playwright-report/**',
      '.svelte-kit/**',
    ],
  },
  ...tseslint.configs.recommended,
  ...svelte.configs['flat/recommended'],
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
    },
  },
  {
    files: ['**/*.svelte', '**/*.svelte.ts'],
    languageOptions: { parserOptions: { parser: tseslint.parser, extraFileExtensions: ['.svelte'] } },
  },
  {
    files: ['core/**/*.ts'],
    ignores: ['core/cli/**'],
    rules: { 'no-restricted-imports': ['error', impureModules] },
  },
  {
    files: ['core/cli/**/*.ts'],
    rules: { 'no-restricted-imports': ['error', { patterns: [otherRooms] }] },
  },
);
