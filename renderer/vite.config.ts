// Browser-mode and desktop renderer build. `npm run web` serves it on 127.0.0.1 (PORT, default 5178);
// `npm start` starts this same config through Vite's JS API; `npm run build` writes dist/renderer.
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import { fileURLToPath } from 'node:url';

const here = fileURLToPath(new URL('.', import.meta.url));
const repo = fileURLToPath(new URL('..', import.meta.url));
const port = Number(process.env.PORT ?? 5178);

export default defineConfig({
  root: here,
  base: './',
  plugins: [vue()],
  clearScreen: false,
  server: {
    host: '127.0.0.1',
    port: Number.isInteger(port) && port >= 0 ? port : 5178,
    strictPort: true,
    // The renderer imports the engine from ../src and the sample from ../sample-data.
    fs: { allow: [repo] },
  },
  preview: { host: '127.0.0.1', port: Number.isInteger(port) && port >= 0 ? port : 5178, strictPort: true },
  worker: { format: 'es' },
  // fontkit's brotli decoder reads WOFF2 fonts only; the brief embeds TrueType (src/deliverables/no-woff2.ts).
  resolve: { alias: [{ find: /^brotli\/decompress(\.js)?$/, replacement: fileURLToPath(new URL('../src/deliverables/no-woff2.ts', import.meta.url)) }] },
  // Pre-bundle up front so the first page load never triggers a dependency re-optimisation and reload (the brief's
  // and the workbook's libraries are imported on first use, so they are listed here too).
  optimizeDeps: {
    include: ['vue', 'chart.js', 'papaparse', 'ml-matrix', 'zod', '@cantoo/pdf-lib', '@cantoo/fontkit', 'write-excel-file/universal'],
    entries: ['index.html', 'worker/engine.worker.ts'],
  },
  // A dependency cache of its own, beside Vite's default one.
  cacheDir: fileURLToPath(new URL('../node_modules/.vite/renderer', import.meta.url)),
  build: {
    outDir: fileURLToPath(new URL('../dist/renderer', import.meta.url)),
    emptyOutDir: true,
    target: 'es2022',
    chunkSizeWarningLimit: 1500,
  },
});
