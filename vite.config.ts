import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

// The API (and in dev the identity provider's sign-in redirect) lives on its own port;
// in dev Vite proxies to it so the browser sees one origin, as it does under `npm start`.
const apiTarget = process.env.EBBLINE_API_URL ?? 'http://localhost:3000';

export default defineConfig({
  root: 'web',
  publicDir: 'public',
  plugins: [react(), tailwindcss()],
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
