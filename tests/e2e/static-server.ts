/** A tiny static HTTP server for the built renderer, on 127.0.0.1 and a random port (tests only). */
import { createServer, type Server } from 'node:http';
import { readFile } from 'node:fs/promises';
import { extname, join, normalize, resolve, sep } from 'node:path';

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
};

export interface StaticServer {
  url: string;
  close(): Promise<void>;
}

export async function serveStatic(rootDir: string): Promise<StaticServer> {
  const root = resolve(rootDir);
  const server: Server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    const file = resolve(root, `.${sep}${normalize(path === '/' ? '/index.html' : path)}`);
    if (!file.startsWith(root + sep)) {
      res.writeHead(403).end();
      return;
    }
    readFile(file).then(
      (body) => res.writeHead(200, { 'content-type': MIME[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-store' }).end(body),
      () => res.writeHead(404).end('not found'),
    );
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  const addr = server.address();
  if (addr === null || typeof addr === 'string') throw new Error('no port');
  return {
    url: `http://127.0.0.1:${addr.port}/`,
    close: () => new Promise<void>((ok) => server.close(() => ok())),
  };
}

export const rendererDir = join(process.cwd(), 'dist', 'renderer');
