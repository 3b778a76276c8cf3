import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { VitePWA } from 'vite-plugin-pwa';

// The API (and in dev the identity provider's sign-in redirect) lives on its own port;
// in dev Vite proxies to it so the browser sees one origin, as it does under `npm start`.
const apiTarget = process.env.EBBLINE_API_URL ?? 'http://localhost:3000';

export default defineConfig({
  root: 'web',
  publicDir: 'public',
  plugins: [
    react(),
    tailwindcss(),
    // installable, and the app shell (scripts, styles, fonts, icons, index.html) works offline
    // at the cabinet; API answers are never cached (another person's data must never show):
    // the readings themselves are kept as drafts in IndexedDB
    VitePWA({
      registerType: 'autoUpdate',
      injectRegister: false, // registered in main.tsx
      strategies: 'generateSW',
      includeAssets: ['favicon.svg', 'apple-touch-icon.png'],
      manifest: {
        name: 'Ebbline',
        short_name: 'Ebbline',
        description: 'Record and judge how drive cabinets’ capacitor banks discharge.',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        orientation: 'portrait',
        background_color: '#0f2a33',
        theme_color: '#0f2a33',
        icons: [
          { src: '/icon-192.png', sizes: '192x192', type: 'image/png' },
          { src: '/icon-512.png', sizes: '512x512', type: 'image/png' },
          { src: '/icon-maskable-512.png', sizes: '512x512', type: 'image/png', purpose: 'maskable' },
        ],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,png,woff2}'],
        // the Latin letters the screens are written in; other scripts (a name in Greek or
        // Cyrillic) load when a page needs them, and offline fall back to the phone's font
        globIgnores: ['**/noto-sans-{cyrillic,cyrillic-ext,devanagari,greek,greek-ext,vietnamese}-*.woff2'],
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//, /^\/auth\//, /^\/feeds\//],
        runtimeCaching: [],
        cleanupOutdatedCaches: true,
        clientsClaim: true,
        skipWaiting: true,
      },
    }),
  ],
  build: {
    outDir: '../dist/web',
    emptyOutDir: true,
    chunkSizeWarningLimit: 700,
  },
  server: {
    port: Number(process.env.EBBLINE_DEV_PORT ?? 5173),
    proxy: {
      '/api': apiTarget,
      '/auth': apiTarget,
    },
  },
});
