// Every browser check of the report pages, in one file and one Chromium (Debian's, through playwright-core,
// headless, fresh profile, background networking off): the file pays the test runner's isolation, the browser's start
// and the loading of the report modules once, and a page two checks open (the demo's report, the reference lap, the
// lap against lap, the loop the sweeps drive) is written once (report-pages.ts). The checks themselves live beside
// this file, one module per page or subject.

import { afterAll, describe } from 'vitest';
import { describeAgainstReport } from './against-report-checks.js';
import { haveChromium, requireChromium, useChromium } from './chromium.js';
import { describeLabels } from './labels-checks.js';
import { describeLapReport } from './lap-report-checks.js';
import { describePageImages, describeSessionPage, sessionPage } from './page-images-checks.js';
import { reportPages } from './report-pages.js';
import { describeSweepReport } from './sweep-report-checks.js';

requireChromium('report page');

const pages = reportPages();
afterAll(() => pages.remove());

const session = sessionPage(pages);
describeSessionPage(session);

describe.skipIf(!haveChromium)('report pages in Chromium', () => {
  const browser = useChromium();
  describePageImages(browser, pages, session);
  describeLapReport(browser, pages);
  describeAgainstReport(browser, pages);
  describeLabels(browser, pages);
  describeSweepReport(browser, pages);
});
