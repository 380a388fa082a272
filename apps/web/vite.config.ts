// import-x cannot follow vite's own files (its resolver crashes on them); this file has no local imports to cycle.
/* eslint import-x/no-cycle: "off" */
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

// The API listens on this port in development; the dev server forwards /api to it (same origin in production).
const apiTarget = `http://127.0.0.1:${process.env.KW_API_PORT ?? '3000'}`;
const apiProxy = { '/api': { target: apiTarget, changeOrigin: false } };

export default defineConfig({
  plugins: [react()],
  // The workspace libraries build to CommonJS: pre-bundle them in dev and convert them in the build.
  optimizeDeps: { include: ['@kerfwright/contracts', '@kerfwright/geometry'] },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    // Maps are written for reading error reports but not linked from the scripts (the server does not publish them).
    sourcemap: 'hidden',
    commonjsOptions: { include: [/libs[\\/]contracts/, /libs[\\/]geometry/, /node_modules/] },
    // Libraries change less often than the app: separate chunks stay cached across releases.
    rolldownOptions: {
      output: {
        codeSplitting: {
          groups: [
            {
              name: 'react',
              test: /node_modules[\\/](react|react-dom|scheduler|react-router|react-router-dom)[\\/]/,
            },
            {
              name: 'mui',
              test: /node_modules[\\/](@mui|@emotion|@popperjs|stylis|react-transition-group)[\\/]/,
            },
            { name: 'vendor', test: /node_modules[\\/]/ },
          ],
        },
      },
    },
  },
  server: { host: '127.0.0.1', port: 5173, strictPort: true, proxy: apiProxy },
  preview: { host: '127.0.0.1', port: 4173, strictPort: true, proxy: apiProxy },
});
