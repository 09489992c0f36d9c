// The browser the report tests drive: Debian's Chromium through playwright-core, headless, with a fresh
// profile and background networking off; a page opened from disk records console problems, dialogs and requests.
// One browser serves every report check of the run (test/browser/report-pages.test.ts): starting it costs more CPU
// than most of the checks it serves.

import { existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM = '/usr/bin/chromium';
export const haveChromium = existsSync(CHROMIUM);

/** Fails in CI without Chromium; elsewhere warns that the tests of `what` are skipped. */
export function requireChromium(what: string): void {
  if (!haveChromium && process.env.CI)
    throw new Error(`${CHROMIUM} is missing; .ci/run installs Debian's chromium package before the tests`);
  if (!haveChromium)
    console.warn(`skipping the ${what} browser tests: ${CHROMIUM} is absent (apt-get install chromium)`);
}

export function launchChromium(profile: string): Promise<BrowserContext> {
  return chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: { width: 1280, height: 900 },
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
}

export interface OpenedPage {
  page: Page;
  problems: string[];
  dialogs: string[];
  requests: string[];
}

export async function openFile(context: BrowserContext, file: string): Promise<OpenedPage> {
  const page = await context.newPage();
  const problems: string[] = [];
  const dialogs: string[] = [];
  const requests: string[] = [];
  page.on('console', (message) => {
    if (message.type() === 'error' || message.type() === 'warning')
      problems.push(`${message.type()}: ${message.text()}`);
  });
  page.on('pageerror', (error) => problems.push(`page error: ${error.message}`));
  page.on('dialog', (dialog) => {
    dialogs.push(dialog.message());
    void dialog.dismiss();
  });
  page.on('request', (request) => requests.push(request.url()));
  await page.goto(pathToFileURL(file).href, { waitUntil: 'load' });
  return { page, problems, dialogs, requests };
}

export interface Chromium {
  /** Opens FILE in a new tab that records its console problems, dialogs and requests. */
  open: (file: string) => Promise<OpenedPage>;
  /** A blank tab kept open for work on images (page-image.ts), opened at its first use. */
  scratch: () => Promise<Page>;
}

/** A fresh browser for the describe block that calls this: launched with a new profile when a test first opens a
 * page (so a run that filters those tests out starts none), closed and the profile removed after the block. */
export function useChromium(): Chromium {
  let profile: string | undefined;
  let launched: Promise<BrowserContext> | undefined;
  let scratch: Promise<Page> | undefined;
  const context = () => (launched ??= launchChromium((profile = mkdtempSync(path.join(tmpdir(), 'reflap-chromium-')))));
  afterAll(async () => {
    // A launch that failed has failed the test that asked for it already.
    await (await launched?.catch(() => undefined))?.close();
    if (profile) rmSync(profile, { recursive: true, force: true });
  });
  return {
    open: async (file) => openFile(await context(), file),
    scratch: () => (scratch ??= context().then((opened) => opened.newPage())),
  };
}

/** Where screenshots for a person to look at go (gitignored). */
export const SCREENSHOT_FOLDER = path.join(path.dirname(fileURLToPath(import.meta.url)), '..', '..', 'test-output');

/** Saves a full-page screenshot as test-output/NAME.png when REFLAP_TEST_SCREENSHOTS=1; a check reads none of them,
 * so a plain run does not pay for them (about half a second of CPU each for a lap report). */
export async function saveScreenshot(page: Page, name: string): Promise<void> {
  if (process.env.REFLAP_TEST_SCREENSHOTS !== '1') return;
  mkdirSync(SCREENSHOT_FOLDER, { recursive: true });
  await page.screenshot({ path: path.join(SCREENSHOT_FOLDER, `${name}.png`), fullPage: true });
}
