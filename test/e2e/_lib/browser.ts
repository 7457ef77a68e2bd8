/**
 * Debian's chromium driven by playwright-core (never a downloaded browser), with the flags
 * that keep it quiet and offline in a container (see /work/shared/TOOLCHAIN.md).
 */
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';

const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

/**
 * Starts chromium headless.
 *
 * @returns the browser; close it when done
 */
export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, args: CHROMIUM_ARGS });
}
