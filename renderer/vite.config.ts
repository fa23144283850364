import { defineConfig } from 'vite';
import { svelte } from '@sveltejs/vite-plugin-svelte';
import { fileURLToPath } from 'node:url';
import { demoStatements } from './demoStatements.ts';

// The renderer is served from a privileged custom protocol in Electron and from
// 127.0.0.1 in browser mode; relative asset paths work for both.
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  base: './',
  plugins: [svelte(), demoStatements(fileURLToPath(new URL('../resources/demo/statements', import.meta.url)))],
  worker: { format: 'es' },
  resolve: { alias: { '@engine': fileURLToPath(new URL('../engine', import.meta.url)) } },
  build: {
    outDir: fileURLToPath(new URL('../dist/renderer', import.meta.url)),
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: false,
  },
  server: { host: '127.0.0.1', port: 5173, strictPort: true },
  preview: { host: '127.0.0.1', port: 4173, strictPort: true },
});
