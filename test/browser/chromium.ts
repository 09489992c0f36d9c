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

/** The window every page opens in. */
const VIEWPORT = { width: 1280, height: 900 };

export function launchChromium(profile: string): Promise<BrowserContext> {
  return chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    headless: true,
    viewport: VIEWPORT,
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

/** What a page reported while it was open. */
type PageReport = Omit<OpenedPage, 'page'>;
const emptyReport = (): PageReport => ({ problems: [], dialogs: [], requests: [] });

/** A tab whose console problems, dialogs and requests go to `report`, the report of the page it shows. */
function reportingTab(page: Page): { page: Page; report: PageReport } {
  const tab = { page, report: emptyReport() };
  page.on('console', (message) => {
    if (message.type() === 'error' || message.type() === 'warning')
      tab.report.problems.push(`${message.type()}: ${message.text()}`);
  });
  page.on('pageerror', (error) => tab.report.problems.push(`page error: ${error.message}`));
  page.on('dialog', (dialog) => {
    tab.report.dialogs.push(dialog.message());
    void dialog.dismiss();
  });
  page.on('request', (request) => tab.report.requests.push(request.url()));
  return tab;
}

export interface Chromium {
  /** Opens FILE from disk, recording its console problems, dialogs and requests. Every file opens in the same tab
   * (a new tab starts a renderer process: about 0.4 s of CPU), so a page is usable until the next open. */
  open: (file: string) => Promise<OpenedPage>;
  /** A second tab, blank, kept for work on images (page-image.ts). */
  scratch: () => Promise<Page>;
}

/** A fresh browser for the describe block that calls this: launched with a new profile when a test first opens a
 * page (so a run that filters those tests out starts none), closed and the profile removed after the block. */
export function useChromium(): Chromium {
  let profile: string | undefined;
  let launched: Promise<BrowserContext> | undefined;
  let tab: Promise<{ page: Page; report: PageReport }> | undefined;
  let scratch: Promise<Page> | undefined;
  const context = () => (launched ??= launchChromium((profile = mkdtempSync(path.join(tmpdir(), 'reflap-chromium-')))));
  afterAll(async () => {
    // A launch that failed has failed the test that asked for it already.
    await (await launched?.catch(() => undefined))?.close();
    if (profile) rmSync(profile, { recursive: true, force: true });
  });
  return {
    open: async (file) => {
      // The persistent context starts with one blank tab: the pages open there.
      const opened = await (tab ??= context().then((browser) => reportingTab(browser.pages()[0]!)));
      const { page } = opened;
      // The scratch tab, once opened, is the one in front; a tab behind it gets no animation frames, so every click
      // (which waits for its target to hold still over two frames) and every hover redrawn on a frame waited about
      // 2 s for a fallback timer instead (about 25 s of the browser file's wall time).
      await page.bringToFront();
      // As in a new tab: the pointer in the corner, off every chart, and the viewport of launchChromium. What the
      // last page reports while it unloads counts against the next one: a failure either way.
      await page.mouse.move(0, 0);
      await page.setViewportSize(VIEWPORT);
      const report = emptyReport();
      opened.report = report;
      await page.goto(pathToFileURL(file).href, { waitUntil: 'load' });
      return { page, ...report };
    },
    scratch: () => (scratch ??= context().then((browser) => browser.newPage())),
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
