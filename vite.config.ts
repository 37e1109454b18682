import { defineConfig } from 'vitest/config';

export default defineConfig({
  root: 'web',
  base: './',
  build: { outDir: '../dist/web', emptyOutDir: true },
  preview: { host: '127.0.0.1', port: 4173, strictPort: true },
  test: {
    root: '.',
    include: ['tests/**/*.test.ts'],
    testTimeout: 120_000,
    hookTimeout: 120_000,
  },
});
