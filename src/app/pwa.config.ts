// Build-time configuration of the service worker and the web manifest (used by vite.config.ts,
// never imported by the app). The runtime side is src/app/pwa.ts.
import type { Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

/**
 * Every built file type the app needs offline. Source maps are left out (nobody needs them at
 * sea); the web manifest is left out because the plugin adds it to the precache itself.
 */
export const PRECACHE_GLOB = '**/*.{js,mjs,css,html,json,geojson,topojson,pbf,png,jpg,jpeg,webp,svg,ico,woff,woff2,wasm,txt}';

/**
 * The largest single file the service worker precaches. Workbox's default (2 MiB) silently drops
 * bigger files, and the map bundle and basemap data are bigger; the offline test checks that
 * every built file is in the precache manifest, so raising this is safe to notice.
 */
export const MAX_PRECACHE_FILE_BYTES = 24 * 1024 * 1024;

export const THEME_COLOUR = '#0b2239';

export function pwa(): Plugin[] {
  return VitePWA({
    // Prompt, never autoUpdate: a new version waits until the observer agrees, so an update can
    // never reload the page under a half-typed observation.
    registerType: 'prompt',
    // src/app/pwa.ts registers the worker itself (no inline script: the CSP forbids them).
    injectRegister: false,
    strategies: 'generateSW',
    // The glob below already takes every file of public/, icons included; listing them again
    // would put each icon twice into the precache manifest.
    includeAssets: [],
    includeManifestIcons: false,
    manifest: {
      id: './',
      name: 'Floe Ledger',
      short_name: 'Floe Ledger',
      description: 'Offline sea-ice observation log for the bridge: hourly observations, map, POLARIS risk, review and export.',
      lang: 'en',
      start_url: './',
      scope: './',
      display: 'standalone',
      orientation: 'any',
      background_color: THEME_COLOUR,
      theme_color: THEME_COLOUR,
      categories: ['productivity', 'utilities'],
      icons: [
        { src: 'icons/icon-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
        { src: 'icons/icon-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
        { src: 'icons/maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        { src: 'icons/floe-ledger.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' },
      ],
    },
    workbox: {
      globPatterns: [PRECACHE_GLOB],
      maximumFileSizeToCacheInBytes: MAX_PRECACHE_FILE_BYTES,
      // Without clientsClaim the first page stays uncontrolled until the next load, and a
      // network loss before that reload would leave the observer without the app.
      clientsClaim: true,
      // Never skip waiting on its own: the page sends SKIP_WAITING when the observer agrees.
      skipWaiting: false,
      cleanupOutdatedCaches: true,
      navigateFallback: 'index.html',
      sourcemap: false,
    },
  });
}

/**
 * The Content-Security-Policy lives in index.html (so `vite preview`, the test server and any
 * static host serve it alike). The dev server needs an inline script for React's hot reload,
 * so the policy is removed there only; builds always keep it.
 */
export function stripCspInDev(): Plugin {
  return {
    name: 'floe:strip-csp-in-dev',
    apply: 'serve',
    transformIndexHtml(html) {
      return html.replace(/\s*<meta http-equiv="Content-Security-Policy"[^>]*>/, '');
    },
  };
}
