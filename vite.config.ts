/// <reference types="vitest/config" />
import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const srcDir = fileURLToPath(new URL('./src', import.meta.url));
const devApiPort = process.env.PORT ?? '3000';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  resolve: { alias: { '@': srcDir } },
  build: { outDir: 'dist/client', emptyOutDir: true, sourcemap: true },
  server: {
    port: 5173,
    proxy: { '/api': { target: `http://localhost:${devApiPort}`, changeOrigin: false } },
  },
  test: {
    setupFiles: ['tests/setup/fail-on-console-error.ts'],
    projects: [
      {
        extends: true,
        test: { name: 'unit', include: ['tests/unit/**/*.test.{ts,tsx}'], environment: 'node' },
      },
      {
        extends: true,
        test: { name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', testTimeout: 30_000 },
      },
      // The same API tests with each app on a PostgreSQL schema of its own (tests/api/support/test-app.ts).
      ...(process.env.TEST_DATABASE_URL
        ? [
            {
              extends: true as const,
              test: {
                name: 'api-postgres',
                include: ['tests/api/**/*.test.ts'],
                environment: 'node' as const,
                testTimeout: 30_000,
                env: { DIPDECK_TEST_DB: 'postgres' },
              },
            },
          ]
        : []),
      {
        extends: true,
        test: {
          name: 'worker',
          include: ['tests/worker/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.spec.ts'],
          environment: 'node',
          testTimeout: 90_000,
          hookTimeout: 90_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
