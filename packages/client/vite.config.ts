import { fileURLToPath } from 'node:url';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig, type ProxyOptions } from 'vite';

const apiOrigin = 'http://127.0.0.1:3000';

// The browser sees one origin, as in production, so the session cookie and the CSRF origin check just work.
const proxy: Record<string, ProxyOptions> = {
  '/api': { target: apiOrigin },
  '/socket.io': { target: apiOrigin, ws: true },
};

export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  plugins: [react(), tailwindcss()],
  server: { host: '127.0.0.1', port: 5173, strictPort: true, proxy },
  preview: { host: '127.0.0.1', port: 4173, proxy },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    target: 'es2022',
    // Maps are written for reading a stack trace by hand, but no bundle points to them, and the server
    // does not serve them in production.
    sourcemap: 'hidden',
    rolldownOptions: {
      output: {
        codeSplitting: {
          groups: [
            // Every screen needs these; a separate chunk stays cached across app releases.
            { name: 'react', test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom)[\\/]/, priority: 2 },
            // Forms live on lazy routes; validation (zod) is heavier still and loads on a form's first use.
            { name: 'forms', test: /node_modules[\\/]react-hook-form[\\/]/, priority: 1 },
            { name: 'validation', test: /node_modules[\\/](@hookform[\\/]resolvers|zod)[\\/]/, priority: 1 },
          ],
        },
      },
    },
  },
});
