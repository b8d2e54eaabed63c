/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The service worker (src/sw.ts): the app shell precached, the running session's GETs kept
    // network first, so the clock opens without network. Built app only: `npx vite` runs without it.
    VitePWA({
      strategies: 'injectManifest',
      srcDir: 'src',
      filename: 'sw.ts',
      // Registered from src/main.tsx: an inline script would need the CSP loosened.
      injectRegister: false,
      manifest: false,
      // A classic script (iife): every browser that has service workers runs it.
      injectManifest: { globPatterns: ['**/*.{js,css,html,svg,woff2}'], rollupFormat: 'iife' },
      devOptions: { enabled: false },
    }),
  ],
  publicDir: false,
  // The manifest lets `npm run measure:bundle` follow each screen's imports (not served: a dot folder).
  build: {
    outDir: 'dist/client',
    emptyOutDir: true,
    sourcemap: false,
    manifest: true,
  },
  server: { host: '127.0.0.1', port: 5173, proxy: { '/api': 'http://127.0.0.1:3000' } },
  test: {
    // Slow or stateful projects run one file at a time so they share one database cleanly.
    projects: [
      {
        extends: true,
        // Pure code: sharing one module graph saves re-importing mathjs for every file.
        test: {
          name: 'engine',
          include: ['tests/shared/**/*.test.ts', 'tests/client/**/*.test.ts'],
          environment: 'node',
          isolate: false,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
