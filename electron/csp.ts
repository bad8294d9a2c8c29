/**
 * The renderer's Content Security Policy: only our own bundle, no remote anything, no inline script,
 * no eval. Injected as a meta tag by vite.config.ts and sent as a header by the app protocol.
 * `img-src data: blob:` lets charts become PNGs for the report; `worker-src blob:` is for Vite's worker
 * loader fallback.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'self'",
  "script-src 'self'",
  "style-src 'self'",
  "img-src 'self' data: blob:",
  "font-src 'self'",
  "connect-src 'self'",
  "worker-src 'self' blob:",
  "object-src 'none'",
  "base-uri 'none'",
  "form-action 'none'",
].join('; ');
