import { defineConfig } from 'vite';
import { svelte } from '@sveltejs/vite-plugin-svelte';

// The renderer is built once and served by both shells: the Electron window (file: URL) and
// browser mode (the loopback server). Relative base so both work.
export default defineConfig({
  root: 'renderer',
  base: './',
  plugins: [svelte()],
  build: {
    outDir: '../dist/renderer',
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: true,
    chunkSizeWarningLimit: 2000,
  },
  worker: { format: 'es' },
});
