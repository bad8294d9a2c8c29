// The app scheme resolver and the content hardening (electron/handlers/app-protocol.ts, electron/security.ts).
// Path-traversal cases are common practice for static file servers, no source.
import { describe, expect, it } from 'vitest';
import { join, resolve } from 'node:path';
import { isAppUrl, mimeTypeOf, resolveAppPath } from '../../electron/handlers/app-protocol';
import { hardenContents, hardenSession, isAllowedRequestUrl } from '../../electron/security';

const root = resolve('/srv/app/renderer');

describe('resolveAppPath', () => {
  it('resolveAppPath maps bundle URLs inside the root', () => {
    expect(resolveAppPath('lagbench-app://ui/index.html', root)).toBe(join(root, 'index.html'));
    expect(resolveAppPath('lagbench-app://ui/assets/main-abc.js', root)).toBe(join(root, 'assets', 'main-abc.js'));
    expect(resolveAppPath('lagbench-app://ui/', root)).toBe(join(root, 'index.html'));
  });
  it('resolveAppPath never leaves the root, however the URL tries to climb out', () => {
    for (const url of ['lagbench-app://ui/../../etc/passwd', 'lagbench-app://ui/%2e%2e/%2e%2e/etc/passwd', 'lagbench-app://ui/..%2f..%2fetc%2fpasswd', 'lagbench-app://ui/a/..%5c..%5c..%5cx']) {
      const p = resolveAppPath(url, root);
      expect(p === null || p.startsWith(root + '/'), `${url} -> ${p}`).toBe(true);
    }
  });
  it('resolveAppPath refuses foreign URLs', () => {
    expect(resolveAppPath('file:///etc/passwd', root)).toBeNull();
    expect(resolveAppPath('https://example.com/index.html', root)).toBeNull();
    expect(resolveAppPath('lagbench-app://other/index.html', root)).toBeNull();
    expect(resolveAppPath('lagbench-app://ui/a%00b', root)).toBeNull();
  });
  it('isAppUrl and mimeTypeOf', () => {
    expect(isAppUrl('lagbench-app://ui/index.html')).toBe(true);
    expect(isAppUrl('http://127.0.0.1/')).toBe(false);
    expect(mimeTypeOf('/a/b.js')).toMatch(/javascript/);
    expect(mimeTypeOf('/a/b.unknown')).toBe('application/octet-stream');
  });
});

describe('hardenContents', () => {
  it('hardenContents blocks foreign navigation, webviews and new windows', () => {
    const listeners: Record<string, (e: { preventDefault(): void }, url?: string) => void> = {};
    let openHandler: ((d: { url: string }) => { action: string }) | undefined;
    hardenContents({
      on: (event: string, l: (e: { preventDefault(): void }, url?: string) => void) => {
        listeners[event] = l;
      },
      setWindowOpenHandler: (h: (d: { url: string }) => { action: string }) => {
        openHandler = h;
      },
    } as never);
    let prevented = 0;
    const ev = { preventDefault: () => { prevented++; } };
    listeners['will-navigate']?.(ev, 'https://evil.example/');
    expect(prevented).toBe(1);
    listeners['will-navigate']?.(ev, 'lagbench-app://ui/index.html');
    expect(prevented).toBe(1);
    listeners['will-redirect']?.(ev, 'file:///etc/passwd');
    listeners['will-attach-webview']?.(ev);
    expect(prevented).toBe(3);
    expect(openHandler?.({ url: 'https://x' })).toEqual({ action: 'deny' });
  });

  it('hardenSession denies permissions and cancels remote requests', () => {
    let perm: ((c: unknown, p: string, cb: (g: boolean) => void) => void) | undefined;
    let req: ((d: { url: string }, cb: (r: { cancel: boolean }) => void) => void) | undefined;
    hardenSession({
      setPermissionRequestHandler: (h) => { perm = h; },
      setPermissionCheckHandler: () => undefined,
      webRequest: { onBeforeRequest: (l) => { req = l; } },
    });
    let granted: boolean | undefined;
    perm?.(null, 'media', (g) => { granted = g; });
    expect(granted).toBe(false);
    const cancelled: boolean[] = [];
    for (const url of ['https://cdn.example/x.js', 'lagbench-app://ui/a.js', 'data:image/png;base64,AA', 'http://127.0.0.1:1/']) req?.({ url }, (r) => cancelled.push(r.cancel));
    expect(cancelled).toEqual([true, false, false, true]);
    expect(isAllowedRequestUrl('blob:lagbench-app://ui/123')).toBe(true);
  });
});
