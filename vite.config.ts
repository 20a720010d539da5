import { fileURLToPath, URL } from 'node:url'
import vue from '@vitejs/plugin-vue'
import { defineConfig } from 'vitest/config'

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
}

export default defineConfig({
  plugins: [vue()],
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
          globalSetup: ['tests/setup/postgres.ts'],
          testTimeout: 60_000,
          hookTimeout: 60_000,
        },
      },
    ],
  },
})
