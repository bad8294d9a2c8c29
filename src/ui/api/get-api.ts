/** The desktop preload API when present (`window.lagbench`), else the browser implementation. */
import type { LagbenchApi } from '../../../electron/ipc';
import { createBrowserApi } from './browser-api';

declare global {
  interface Window {
    lagbench?: LagbenchApi;
  }
}

export function getApi(): LagbenchApi {
  return window.lagbench ?? createBrowserApi();
}
