import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';

/**
 * The dev server's React refresh preamble is an inline <script>, which the page's
 * Content-Security-Policy (script-src 'self') blocks. Drop the CSP meta in `vite` (serve)
 * only; `vite build`, `npm start` and the browser tests keep the strict policy.
 */
function relaxCspInDevServer(): Plugin {
  return {
    name: 'crestline-relax-csp-in-dev',
    apply: 'serve',
    transformIndexHtml(html) {
      return html.replace(/<meta\s+http-equiv="Content-Security-Policy"[^>]*>\s*/, '');
    },
  };
}

export default defineConfig({
  plugins: [react(), relaxCspInDevServer()],
  worker: { format: 'es' },
  build: {
    target: 'es2022',
    // Plotly's dist bundle (~4.8 MB) is its own lazily loaded chunk; the first page chunk stays small.
    chunkSizeWarningLimit: 5000,
  },
  server: { host: '127.0.0.1' },
  preview: { host: '127.0.0.1' },
});
