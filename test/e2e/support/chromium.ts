/** Debian Chromium driven by playwright-core, rendering WebGL on SwiftShader (no GPU). */
import { chromium, type Browser } from 'playwright-core';

export const CHROMIUM_PATH = process.env.TILTBENCH_CHROMIUM ?? '/usr/bin/chromium';

export const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--enable-unsafe-swiftshader',
  '--use-angle=swiftshader',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
];

export function launchChromium(): Promise<Browser> {
  return chromium.launch({ executablePath: CHROMIUM_PATH, headless: true, args: CHROMIUM_ARGS });
}
