/**
 * Hardening applied to every web contents the app creates: no navigation away from our bundle,
 * no new windows, no webviews, no permission grants, no remote content.
 */
import { isAppUrl } from './handlers/app-protocol';

/** The parts of Electron's WebContents / session used here (a narrow port keeps this testable). */
export interface HardenableContents {
  on(event: 'will-navigate' | 'will-redirect', listener: (event: { preventDefault(): void }, url: string) => void): void;
  on(event: 'will-attach-webview', listener: (event: { preventDefault(): void }) => void): void;
  setWindowOpenHandler(handler: (details: { url: string }) => { action: 'deny' }): void;
}

export interface PermissionSession {
  setPermissionRequestHandler(handler: (contents: unknown, permission: string, callback: (granted: boolean) => void) => void): void;
  setPermissionCheckHandler(handler: () => boolean): void;
  webRequest: {
    onBeforeRequest(listener: (details: { url: string }, callback: (response: { cancel: boolean }) => void) => void): void;
  };
}

/** Blocks navigation (except within our own bundle), new windows and webviews. */
export function hardenContents(contents: HardenableContents): void {
  const blockForeign = (event: { preventDefault(): void }, url: string): void => {
    if (!isAppUrl(url)) event.preventDefault();
  };
  contents.on('will-navigate', blockForeign);
  contents.on('will-redirect', blockForeign);
  contents.on('will-attach-webview', (event) => event.preventDefault());
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
}

/** Whether a request may leave the renderer: only our bundle, data: and blob: URLs (charts, downloads). */
export function isAllowedRequestUrl(url: string): boolean {
  return isAppUrl(url) || url.startsWith('data:') || url.startsWith('blob:lagbench-app://') || url.startsWith('devtools://');
}

/** Denies every permission (camera, geolocation, notifications …) and cancels remote requests. */
export function hardenSession(session: PermissionSession): void {
  session.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
  session.setPermissionCheckHandler(() => false);
  session.webRequest.onBeforeRequest((details, callback) => callback({ cancel: !isAllowedRequestUrl(details.url) }));
}
