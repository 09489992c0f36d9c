// The browser the report tests drive: Debian's Chromium through playwright-core, headless, with a fresh
// profile and background networking off; a page opened from disk records console problems, dialogs and requests.

import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { afterAll, beforeAll } from 'vitest';
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

/** A fresh browser for the describe block that calls this: launched with a new profile before its tests, closed
 * and the profile removed after them. Call it before the block's own hooks that open pages. */
export function useChromium(): { open: (file: string) => Promise<OpenedPage>; context: () => BrowserContext } {
  let context: BrowserContext | undefined;
  let profile: string | undefined;
  beforeAll(async () => {
    profile = mkdtempSync(path.join(tmpdir(), 'reflap-chromium-'));
    context = await launchChromium(profile);
  });
  afterAll(async () => {
    await context?.close();
    if (profile) rmSync(profile, { recursive: true, force: true });
  });
  const opened = (): BrowserContext => {
    if (!context) throw new Error('useChromium: the browser is opened in beforeAll; use it inside hooks or tests');
    return context;
  };
  return { open: (file) => openFile(opened(), file), context: opened };
}
