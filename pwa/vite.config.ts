import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defaultClientConditions, defaultServerConditions, type ProxyOptions } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';
import { defineConfig } from 'vitest/config';

/**
 * physics-core is consumed from its TypeScript source through this export condition
 * (see physics-core/package.json "exports"). Vite 6+ replaces the default conditions when
 * `resolve.conditions` is set, so the defaults are spread back in.
 */
const SOURCE_CONDITION = '@phasewright/source';

/** Theme colour shared by the manifest and <meta name="theme-color">: the paper of the header. */
const THEME_COLOR = '#f5f1e8';
const BACKGROUND_COLOR = '#f5f1e8';

/** The API lives on the sync server; in dev and preview Vite forwards /api to it. */
const apiProxy: Record<string, ProxyOptions> = {
  '/api': { target: process.env.PW_API_TARGET ?? 'http://127.0.0.1:8080', changeOrigin: false },
};

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    VitePWA({
      // 'prompt': a new version waits until the user accepts it. A sweep may be running in
      // the page's workers; an automatic reload ('autoUpdate') could cut it off mid-way.
      registerType: 'prompt',
      // main.tsx registers the worker itself through virtual:pwa-register.
      injectRegister: false,
      includeAssets: ['logo-mark.svg'],
      manifest: {
        name: 'Phasewright',
        short_name: 'Phasewright',
        description:
          'Offline-first workbench for ground-state phase diagrams of lattice models of hardcore bosons.',
        theme_color: THEME_COLOR,
        background_color: BACKGROUND_COLOR,
        display: 'standalone',
        start_url: '/',
        scope: '/',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
          { src: '/logo-mark.svg', sizes: 'any', type: 'image/svg+xml' },
        ],
      },
      workbox: {
        // The shell (html, js, css), the logo and icons, and the Manrope font files.
        globPatterns: ['**/*.{html,js,css,svg,png,webmanifest,woff2}'],
        navigateFallback: 'index.html',
        // API calls and the OpenAPI docs must always reach the server, never the shell.
        navigateFallbackDenylist: [/^\/api(?:\/|$)/],
        cleanupOutdatedCaches: true,
      },
    }),
  ],
  resolve: { conditions: [SOURCE_CONDITION, ...defaultClientConditions] },
  ssr: { resolve: { conditions: [SOURCE_CONDITION, ...defaultServerConditions] } },
  server: { proxy: apiProxy },
  preview: { proxy: apiProxy },
  build: { sourcemap: true },
  test: {
    environment: 'jsdom',
    setupFiles: ['./src/test/setup.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    css: false,
  },
});
