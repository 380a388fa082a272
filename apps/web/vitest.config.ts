import { defineConfig, mergeConfig } from 'vitest/config';
import viteConfig from './vite.config.ts';

export default mergeConfig(
  viteConfig,
  defineConfig({
    test: {
      environment: 'jsdom',
      include: ['src/**/*.test.{ts,tsx}'],
      setupFiles: ['./src/testing/setup-tests.ts'],
      restoreMocks: true,
      unstubGlobals: true,
      css: false,
      testTimeout: 30_000,
    },
  }),
);
