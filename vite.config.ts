import { fileURLToPath, URL } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vite';

const here = (path: string) => fileURLToPath(new URL(path, import.meta.url));

export const aliases = {
  '@schema': here('./schema'),
  '@stats': here('./stats'),
  '@frontend': here('./frontend/src'),
};

// The browser app lives in frontend/; the API (Express) serves the built files from dist/client.
export default defineConfig({
  root: here('./frontend'),
  publicDir: here('./frontend/public'),
  plugins: [react(), tailwindcss()],
  resolve: { alias: aliases },
  build: {
    // CLIENT_DIR lets parallel work build into a private folder; the server reads the same variable.
    outDir: process.env.CLIENT_DIR ?? here('./dist/client'),
    emptyOutDir: true,
    sourcemap: false,
    chunkSizeWarningLimit: 5000,
  },
  server: {
    port: 5173,
    proxy: { '/api': { target: `http://127.0.0.1:${process.env.PORT ?? 3000}`, changeOrigin: false } },
  },
});
