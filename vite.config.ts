// Renderer build: src/ui → dist/renderer, relative asset paths (served from lagbench-app://ui/ in the
// desktop app and from a local HTTP server in the browser tests), module workers, and the strict CSP
// (electron/csp.ts) injected as a meta tag.
import { defineConfig, type Plugin } from 'vite';
import { CONTENT_SECURITY_POLICY } from './electron/csp';

function cspMeta(): Plugin {
  return {
    name: 'lagbench-csp-meta',
    transformIndexHtml(html) {
      return html.replace('<!-- CSP -->', `<meta http-equiv="Content-Security-Policy" content="${CONTENT_SECURITY_POLICY}" />`);
    },
  };
}

export default defineConfig({
  root: 'src/ui',
  base: './',
  publicDir: false,
  plugins: [cspMeta()],
  worker: { format: 'es' },
  build: {
    outDir: '../../dist/renderer',
    emptyOutDir: true,
    target: 'es2022',
    sourcemap: false,
    // Inline assets would be data: URLs; keep them files so 'self' covers them.
    assetsInlineLimit: 0,
    modulePreload: { polyfill: false },
    chunkSizeWarningLimit: 1500,
  },
});
