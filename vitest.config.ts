import { defineConfig } from 'vitest/config';
import { svelte } from '@sveltejs/vite-plugin-svelte';
import { svelteTesting } from '@testing-library/svelte/vite';

export default defineConfig({
  plugins: [svelte(), svelteTesting()],
  test: {
    include: [
      'test/unit/**/*.test.ts',
      'test/reference/**/*.test.ts',
      'test/regression/**/*.test.ts',
      'renderer/**/*.svelte.test.ts',
    ],
    environment: 'node',
    setupFiles: ['test/helpers/setup.ts'],
    pool: 'forks',
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
