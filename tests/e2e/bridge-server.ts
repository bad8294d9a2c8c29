/**
 * The built renderer on 127.0.0.1 (as static-server.ts) plus the QC bridge: `GET /bridge/info` for
 * feature detection and `POST /bridge/<channel>` with `{ "args": [...] }`, answered by the SAME
 * handlers as the desktop app's main process (electron/handlers/qc-handlers.ts) after the same
 * argument validation (validateQcArgs). Tests only; it listens on the loopback interface.
 */
import { createServer, type IncomingMessage, type Server } from 'node:http';
import { readFile } from 'node:fs/promises';
import { extname, normalize, resolve, sep } from 'node:path';
import { createQcHandlers, type QcHandlerDeps } from '../../electron/handlers/qc-handlers';
import { QC_CHANNELS, validateQcArgs, type QcChannel } from '../../electron/qc-ipc';

const MIME: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
};

/** Largest request body: 30 MB (an analysed chip with its step plots). */
const MAX_BODY_BYTES = 30_000_000;

export interface BridgeServer {
  url: string;
  close(): Promise<void>;
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((ok, fail) => {
    const parts: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > MAX_BODY_BYTES) {
        fail(new Error('request too large'));
        req.destroy();
      } else parts.push(c);
    });
    req.on('end', () => ok(Buffer.concat(parts).toString('utf8')));
    req.on('error', fail);
  });
}

export async function serveWithBridge(rootDir: string, deps: Omit<QcHandlerDeps, 'via' | 'save'>): Promise<BridgeServer> {
  const root = resolve(rootDir);
  const handlers = createQcHandlers({ ...deps, via: 'bridge' });
  const channels = Object.values(QC_CHANNELS) as string[];
  const json = (res: import('node:http').ServerResponse, status: number, body: unknown): void => {
    res.writeHead(status, { 'content-type': 'application/json', 'cache-control': 'no-store' }).end(JSON.stringify(body));
  };
  const server: Server = createServer((req, res) => {
    const path = decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname);
    if (path === '/bridge/info' && req.method === 'GET') return json(res, 200, { bridge: 'lagbench-qc' });
    if (path.startsWith('/bridge/')) {
      const channel = path.slice('/bridge/'.length);
      if (req.method !== 'POST' || !channels.includes(channel)) return json(res, 404, { error: `no such bridge call: ${req.method} ${channel}` });
      // Same-origin pages only (the renderer served here); a page elsewhere cannot drive the store.
      const origin = req.headers.origin;
      if (origin !== undefined && origin !== `http://${req.headers.host ?? ''}`) return json(res, 403, { error: 'refused a cross-origin call' });
      void readBody(req)
        .then(async (text) => {
          const body = JSON.parse(text) as { args?: unknown };
          if (!Array.isArray(body.args)) throw new Error('the body must be { "args": [...] }');
          const checked = validateQcArgs(channel as QcChannel, body.args);
          const handler = handlers[channel as QcChannel] as (...a: unknown[]) => Promise<unknown>;
          json(res, 200, { result: await handler(...(checked as unknown[])) });
        })
        .catch((err: unknown) => json(res, 400, { error: err instanceof Error ? err.message : String(err) }));
      return;
    }
    const file = resolve(root, `.${sep}${normalize(path === '/' ? '/index.html' : path)}`);
    if (!file.startsWith(root + sep)) return void res.writeHead(403).end();
    readFile(file).then(
      (b) => res.writeHead(200, { 'content-type': MIME[extname(file)] ?? 'application/octet-stream', 'cache-control': 'no-store' }).end(b),
      () => res.writeHead(404).end('not found'),
    );
  });
  await new Promise<void>((ok) => server.listen(0, '127.0.0.1', ok));
  const addr = server.address();
  if (addr === null || typeof addr === 'string') throw new Error('no port');
  return { url: `http://127.0.0.1:${addr.port}/`, close: () => new Promise<void>((ok) => server.close(() => ok())) };
}
