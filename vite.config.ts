import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

const DEMO_DIR = resolve(import.meta.dirname, 'fixtures/demo');

/**
 * The bench app's demo experiment uses the generator's committed demo plates. They are copied
 * into the build under demo/ (and served from there in dev), so the service worker precaches
 * them with the rest of the app and the demo works offline.
 */
function demoPlates(): Plugin {
  const files = () =>
    existsSync(DEMO_DIR)
      ? readdirSync(DEMO_DIR)
          .filter((f) => /\.(jpe?g|png)$/i.test(f))
          .sort()
      : [];
  return {
    name: 'rivalplate-demo-plates',
    configureServer(server) {
      server.middlewares.use('/demo/', (req, res, next) => {
        const name = decodeURIComponent((req.url ?? '').replace(/^\//, '').split('?')[0]!);
        if (name === 'index.json') {
          res.setHeader('content-type', 'application/json');
          res.end(JSON.stringify(files()));
        } else if (files().includes(name)) {
          res.setHeader('content-type', name.endsWith('.png') ? 'image/png' : 'image/jpeg');
          res.end(readFileSync(join(DEMO_DIR, name)));
        } else next();
      });
    },
    generateBundle() {
      for (const name of files()) {
        this.emitFile({
          type: 'asset',
          fileName: `demo/${name}`,
          source: readFileSync(join(DEMO_DIR, name)),
        });
      }
      this.emitFile({
        type: 'asset',
        fileName: 'demo/index.json',
        source: JSON.stringify(files()),
      });
    },
  };
}

export default defineConfig({
  root: 'web',
  base: './',
  build: { outDir: '../dist', emptyOutDir: true, target: 'es2022' },
  worker: { format: 'es' },
  // Pre-bundled up front, or the dev server finds them mid-load and reloads the page.
  optimizeDeps: { include: ['@techstark/opencv-js', 'comlink', 'idb'] },
  preview: { host: '127.0.0.1', port: 4173, strictPort: true },
  plugins: [
    react(),
    demoPlates(),
    VitePWA({
      registerType: 'prompt',
      // The app registers the service worker itself (web/app/service-worker.ts) to offer updates.
      injectRegister: false,
      // Our own service worker (web/sw/sw.ts): precaching plus the Background Sync handler.
      strategies: 'injectManifest',
      srcDir: 'sw',
      filename: 'sw.ts',
      includeAssets: ['icons/*.svg', 'icons/*.png'],
      manifest: {
        name: 'Rivalplate',
        short_name: 'Rivalplate',
        description:
          'Count two-colour competition plates at the bench and turn them into relative fitness.',
        start_url: './',
        scope: './',
        display: 'standalone',
        orientation: 'portrait',
        background_color: '#f3eee4',
        theme_color: '#1f3b36',
        icons: [
          { src: 'icons/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: 'icons/icon-512.png', sizes: '512x512', type: 'image/png' },
          {
            src: 'icons/icon-maskable-512.png',
            sizes: '512x512',
            type: 'image/png',
            purpose: 'maskable',
          },
          { src: 'icons/icon.svg', sizes: 'any', type: 'image/svg+xml' },
        ],
      },
      injectManifest: {
        globPatterns: ['**/*.{js,css,html,wasm,svg,png,jpg,json,webmanifest}'],
        // The worker chunk carries opencv.js (about 11 MB); the default limit is 2 MiB.
        maximumFileSizeToCacheInBytes: 16 * 1024 * 1024,
        // One classic script: registered without `type: 'module'`, which older browsers lack.
        rollupFormat: 'iife',
      },
    }),
  ],
});
