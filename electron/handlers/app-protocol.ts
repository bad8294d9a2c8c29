/**
 * The renderer is served from `lagbench-app://ui/…` (a privileged standard, secure scheme) instead of
 * file://, so the CSP's 'self' means exactly our bundle, module workers load, and nothing outside
 * dist/renderer can be fetched (no path traversal).
 */
import { normalize, resolve, sep } from 'node:path';

export const APP_SCHEME = 'lagbench-app';
export const APP_HOST = 'ui';
export const APP_ENTRY_URL = `${APP_SCHEME}://${APP_HOST}/index.html`;

/** Whether a URL belongs to our own renderer bundle. */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host === APP_HOST;
  } catch {
    return false;
  }
}

/** Maps an app URL to a file inside `rootDir`, or null when it is foreign or escapes the root. */
export function resolveAppPath(url: string, rootDir: string): string | null {
  if (!isAppUrl(url)) return null;
  let pathname: string;
  try {
    pathname = decodeURIComponent(new URL(url).pathname);
  } catch {
    return null;
  }
  if (pathname.includes('\u0000')) return null;
  const root = resolve(rootDir);
  const target = resolve(root, `.${sep}${normalize(pathname === '/' ? '/index.html' : pathname)}`);
  return target === root || target.startsWith(root + sep) ? target : null;
}

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.woff2': 'font/woff2',
  '.map': 'application/json',
};

export function mimeTypeOf(path: string): string {
  const dot = path.lastIndexOf('.');
  return MIME[dot >= 0 ? path.slice(dot).toLowerCase() : ''] ?? 'application/octet-stream';
}
