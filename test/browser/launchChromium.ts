// Launching Debian's headless Chromium through playwright-core with everything network-ish switched off.
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext } from 'playwright-core';

/** Where the browser tests expect Chromium (Debian package `chromium`; .ci/run installs it). */
export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/** True when the browser the suite needs is installed. */
export function chromiumAvailable(): boolean {
  return existsSync(CHROMIUM_PATH);
}

/**
 * A fresh persistent context (its own throw-away user-data-dir) and a function that closes it and
 * removes the folder.
 */
export async function launchFreshContext(viewport = { width: 1280, height: 900 }): Promise<{ context: BrowserContext; close: () => Promise<void> }> {
  const userDataDir = mkdtempSync(join(tmpdir(), 'compass-debrief-chromium-'));
  const context = await chromium.launchPersistentContext(userDataDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: CHROMIUM_ARGS,
    viewport,
    offline: true,
    acceptDownloads: true,
  });
  return {
    context,
    close: async () => {
      await context.close();
      rmSync(userDataDir, { recursive: true, force: true });
    },
  };
}
