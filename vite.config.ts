import { execFileSync } from 'node:child_process'
import { fileURLToPath, URL } from 'node:url'
import vue from '@vitejs/plugin-vue'
import { VitePWA } from 'vite-plugin-pwa'
import { defineConfig } from 'vitest/config'

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
}

/** The build's label, shown in Settings: `CHOPLINE_BUILD`, else the commit it was built from. */
function buildLabel(): string {
  if (process.env.CHOPLINE_BUILD) return process.env.CHOPLINE_BUILD
  try {
    return execFileSync('git', ['rev-parse', '--short', 'HEAD'], { encoding: 'utf8' }).trim()
  } catch {
    return 'local'
  }
}

export default defineConfig({
  define: { 'import.meta.env.CHOPLINE_BUILD': JSON.stringify(buildLabel()) },
  plugins: [
    vue(),
    // The installable app: the manifest, and the service worker in src/sw/ (Workbox), which
    // precaches the built shell and keeps the API answers a page needs at the ramp.
    VitePWA({
      strategies: 'injectManifest',
      srcDir: 'src/sw',
      filename: 'sw.ts',
      registerType: 'autoUpdate',
      // Registered by src/offline/register.ts after the first page is up, not by a script in <head>.
      injectRegister: false,
      injectManifest: {
        globPatterns: ['**/*.{js,css,html,woff2,svg,png}'],
        // The typeface's Latin files are what the app's words need.
        globIgnores: ['**/*-vietnamese-*'],
        // index.html is the shell the worker answers with offline; the rest are hashed assets.
        maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
      },
      includeAssets: [],
      manifest: {
        name: 'Chopline',
        short_name: 'Chopline',
        description: 'Lake conditions and a daily fishing read for bass anglers and guides.',
        start_url: '/lakes',
        scope: '/',
        display: 'standalone',
        background_color: '#f4f8f9',
        theme_color: '#1f5f7a',
        icons: [
          { src: '/icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icons/icon.svg', sizes: 'any', type: 'image/svg+xml' },
          {
            src: '/icons/maskable-512.png',
            sizes: '512x512',
            type: 'image/png',
            purpose: 'maskable',
          },
        ],
      },
    }),
  ],
  resolve: { alias },
  publicDir: 'src/public',
  // The manifest lets `npm run bench -- dashboard` count what a route loads before it is usable.
  build: { outDir: 'dist', chunkSizeWarningLimit: 700, manifest: true },
  test: {
    projects: [
      {
        extends: true,
        test: { name: 'shared', environment: 'node', include: ['tests/shared/**/*.test.ts'] },
      },
      {
        extends: true,
        test: {
          name: 'server',
          environment: 'node',
          include: ['tests/server/**/*.test.ts'],
          // A throwaway cluster per run; each test file copies its template database.
          globalSetup: ['tests/setup/postgres.ts'],
          // Whole days run through the jobs and the database: room for a busy two-core machine.
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: { name: 'client', environment: 'jsdom', include: ['tests/src/**/*.test.ts'] },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['tests/e2e/**/*.test.ts'],
          // Chromium first: without it (and not root to install it) the run stops with the command.
          globalSetup: ['tests/setup/chromium.ts', 'tests/setup/postgres.ts'],
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
})
