// Lint rules, including the layer boundaries of DESIGN.md: imports point downward only.
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import globals from 'globals';

const uiLibraries = [
  { name: 'react', message: 'src/domain and src/format are pure TypeScript: no React.' },
  { name: 'react-dom', message: 'src/domain and src/format are pure TypeScript: no React.' },
  { name: 'dexie', message: 'Only src/db touches storage.' },
  { name: 'dexie-react-hooks', message: 'Only src/db and features use live queries.' },
  { name: 'maplibre-gl', message: 'Only src/features/map imports MapLibre.' },
  { name: 'zustand', message: 'UI state lives in src/state.' },
];

const upperLayers = (...layers) =>
  layers.map((l) => ({ group: [`**/${l}/**`, `**/${l}`], message: `This layer may not import from src/${l} (imports point downward only, see DESIGN.md).` }));

export default tseslint.config(
  { ignores: ['dist/**', 'dist-*/**', 'node_modules/**', '.vite-cache/**', 'test-results/**', 'bench-results/**', 'src/format/generated/**', 'public/**'] },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.browser, ...globals.node } },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      ...reactHooks.configs.recommended.rules,
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': ['error', { argsIgnorePattern: '^_', varsIgnorePattern: '^_' }],
      'no-restricted-imports': ['error', { paths: [{ name: 'maplibre-gl', message: 'Only src/features/map imports MapLibre.' }] }],
    },
  },
  {
    files: ['src/domain/**'],
    languageOptions: { globals: { ...globals.es2022 } },
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries, patterns: upperLayers('app', 'features', 'state', 'db', 'gps', 'format', 'cli', 'sync', 'iceinfo') }],
      'no-restricted-globals': ['error', 'window', 'document', 'navigator', 'localStorage', 'indexedDB'],
    },
  },
  {
    files: ['src/format/**'],
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries, patterns: upperLayers('app', 'features', 'state', 'db', 'gps', 'cli', 'sync', 'iceinfo') }],
    },
  },
  {
    files: ['src/db/**'],
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries.filter((p) => p.name !== 'dexie' && p.name !== 'dexie-react-hooks'), patterns: upperLayers('app', 'features', 'state', 'gps', 'cli', 'sync', 'iceinfo') }],
    },
  },
  {
    // Ice chart and grid readers: over domain/ only (DESIGN.md); the app and the CLI call them.
    files: ['src/iceinfo/**'],
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries, patterns: upperLayers('app', 'features', 'state', 'db', 'gps', 'format', 'cli', 'sync') }],
    },
  },
  {
    files: ['src/gps/**'],
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries, patterns: upperLayers('app', 'features', 'state', 'db', 'cli', 'sync') }],
    },
  },
  {
    // Replication with a CouchDB server: over db/ and format/, below the screens.
    files: ['src/sync/**'],
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries.filter((p) => p.name !== 'dexie'), patterns: upperLayers('app', 'features', 'state', 'gps', 'cli') }],
    },
  },
  {
    files: ['src/cli/**'],
    rules: {
      'no-restricted-imports': ['error', { paths: uiLibraries, patterns: upperLayers('app', 'features', 'state') }],
    },
  },
  {
    files: ['src/features/map/**'],
    rules: { 'no-restricted-imports': 'off' },
  },
  {
    files: ['test/**', 'scripts/**', 'server/**'],
    rules: { 'no-restricted-imports': 'off' },
  },
);
