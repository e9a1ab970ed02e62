// measureReportInBrowser: how long a report page takes to draw in headless Chromium (used by the bench).
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';
import { launchFreshContext } from './launchChromium.js';

/**
 * Opens the report at htmlPath from a file:// URL in a fresh headless Chromium and returns the time
 * from the start of navigation (performance.timeOrigin) until the page's script has drawn every chart
 * (it sets window.__reportReady = performance.now() then) [ms].
 * @throws Error when the page does not report ready within 60 s or throws while loading
 */
export async function measureReportInBrowser(htmlPath: string): Promise<{ drawnMs: number }> {
  const { context, close } = await launchFreshContext();
  try {
    const page = await context.newPage();
    const pageErrors: string[] = [];
    page.on('pageerror', (e) => pageErrors.push(e.message));
    await page.goto(pathToFileURL(resolve(htmlPath)).href, { waitUntil: 'load' });
    await page.waitForFunction(() => typeof (window as unknown as { __reportReady?: number }).__reportReady === 'number', undefined, { timeout: 60_000 });
    if (pageErrors.length > 0) throw new Error(`report page error: ${pageErrors[0]}`);
    const drawnMs = await page.evaluate(() => (window as unknown as { __reportReady: number }).__reportReady);
    return { drawnMs };
  } finally {
    await close();
  }
}
