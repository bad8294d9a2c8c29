/**
 * Launching Debian's Chromium for the browser tests (GUIDE §4 recipe): headless, fresh profile, no background
 * networking, 1280×800, downloads allowed. Page errors, console errors and any request that would leave
 * 127.0.0.1 (no remote content) are collected in `errors`; such requests are aborted.
 */
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';

export async function launchChromium(profileDir: string, errors: string[]): Promise<{ context: BrowserContext; page: Page }> {
  const context = await chromium.launchPersistentContext(profileDir, {
    executablePath: CHROMIUM,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
    viewport: { width: 1280, height: 800 },
    acceptDownloads: true,
    colorScheme: 'light',
  });
  const page = context.pages()[0] ?? (await context.newPage());
  page.on('pageerror', (e) => errors.push(`pageerror: ${e.message}`));
  page.on('console', (m) => {
    if (m.type() === 'error') errors.push(`console: ${m.text()}`);
  });
  await context.route(/^(?!http:\/\/127\.0\.0\.1|data:|blob:)/, (route) => {
    errors.push(`remote request: ${route.request().url()}`);
    return route.abort();
  });
  return { context, page };
}
