/**
 * Debian's Chromium, started as every browser test starts it: headless, no sandbox (the tests run
 * as root), and none of the background services that would try to reach the network.
 */
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';

export function launchChromium(): Promise<Browser> {
  return chromium.launch({
    executablePath: CHROMIUM,
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run', '--disable-quic'],
  });
}
