// A page's layout against a stored reference image: the whole page is captured at a fixed viewport, scaled down to
// a small thumbnail in Chromium's own canvas (no image library), and compared pixel by pixel in grey levels with a
// tolerance, so that a moved or missing block fails while anti-aliasing and font hinting do not. The reference
// images are written only by scripts/update-page-images.sh (REFLAP_UPDATE_PAGE_IMAGES=1).

import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';

export const PAGE_IMAGE_FOLDER = path.join(path.dirname(fileURLToPath(import.meta.url)), 'page-images');
export const UPDATE_PAGE_IMAGES = process.env.REFLAP_UPDATE_PAGE_IMAGES === '1';
/** The viewport pages are laid out in, and the width of the stored thumbnail. */
export const PAGE_VIEWPORT = { width: 1280, height: 900 };
const THUMBNAIL_WIDTH = 256;

export interface ImageDifference {
  /** Thumbnail sizes, px. */
  actual: { width: number; height: number };
  reference: { width: number; height: number };
  /** Mean absolute grey-level difference, 0-255, and the share of pixels that differ by more than 48 levels. */
  meanDifference: number;
  changedShare: number;
}

/** Tolerances: a layout regression moves whole blocks and shows far above these (common practice, no source). */
export const IMAGE_TOLERANCE = { meanDifference: 6, changedShare: 0.03, heightShare: 0.02 };

async function thumbnailOf(scratch: Page, png: Buffer, width: number): Promise<{ dataUrl: string; height: number }> {
  return scratch.evaluate(
    async ({ source, width }) => {
      const image = new Image();
      image.src = source;
      await image.decode();
      const height = Math.max(1, Math.round((image.height * width) / image.width));
      const canvas = document.createElement('canvas');
      canvas.width = width;
      canvas.height = height;
      const context = canvas.getContext('2d')!;
      context.imageSmoothingQuality = 'high';
      context.drawImage(image, 0, 0, width, height);
      // Stored in grey levels (Rec. ITU-R BT.601 luma), which is all the comparison reads and keeps the files small.
      const pixels = context.getImageData(0, 0, width, height);
      const data = pixels.data;
      for (let i = 0; i < data.length; i += 4) {
        const luma = Math.round(0.299 * data[i]! + 0.587 * data[i + 1]! + 0.114 * data[i + 2]!);
        data[i] = data[i + 1] = data[i + 2] = luma;
      }
      context.putImageData(pixels, 0, 0);
      return { dataUrl: canvas.toDataURL('image/png'), height };
    },
    { source: `data:image/png;base64,${png.toString('base64')}`, width },
  );
}

async function difference(scratch: Page, actual: string, reference: string): Promise<ImageDifference> {
  return scratch.evaluate(
    async ({ actual, reference }) => {
      const load = async (source: string) => {
        const image = new Image();
        image.src = source;
        await image.decode();
        return image;
      };
      const [a, r] = await Promise.all([load(actual), load(reference)]);
      const width = Math.min(a.width, r.width);
      const height = Math.min(a.height, r.height);
      const grey = (image: HTMLImageElement) => {
        const canvas = document.createElement('canvas');
        canvas.width = width;
        canvas.height = height;
        const context = canvas.getContext('2d')!;
        context.drawImage(image, 0, 0);
        const { data } = context.getImageData(0, 0, width, height);
        const out = new Float64Array(width * height);
        // Rec. ITU-R BT.601 luma weights.
        for (let i = 0; i < out.length; i++)
          out[i] = 0.299 * data[4 * i]! + 0.587 * data[4 * i + 1]! + 0.114 * data[4 * i + 2]!;
        return out;
      };
      const ga = grey(a);
      const gr = grey(r);
      let sum = 0;
      let changed = 0;
      for (let i = 0; i < ga.length; i++) {
        const d = Math.abs(ga[i]! - gr[i]!);
        sum += d;
        if (d > 48) changed++;
      }
      return {
        actual: { width: a.width, height: a.height },
        reference: { width: r.width, height: r.height },
        meanDifference: sum / ga.length,
        changedShare: changed / ga.length,
      };
    },
    { actual, reference },
  );
}

/**
 * The page's thumbnail against test/browser/page-images/NAME.png; with REFLAP_UPDATE_PAGE_IMAGES=1 the reference is
 * written instead (and null returned). The page should be laid out at PAGE_VIEWPORT and in its initial state. The
 * images are scaled and compared in SCRATCH, a blank tab (a report page's own content policy refuses data: images).
 */
export async function comparePageImage(scratch: Page, page: Page, name: string): Promise<ImageDifference | null> {
  await page.setViewportSize(PAGE_VIEWPORT);
  const png = await page.screenshot({ fullPage: true, animations: 'disabled', caret: 'hide' });
  const thumbnail = await thumbnailOf(scratch, png, THUMBNAIL_WIDTH);
  const file = path.join(PAGE_IMAGE_FOLDER, `${name}.png`);
  if (UPDATE_PAGE_IMAGES) {
    mkdirSync(PAGE_IMAGE_FOLDER, { recursive: true });
    writeFileSync(file, Buffer.from(thumbnail.dataUrl.split(',')[1]!, 'base64'));
    return null;
  }
  if (!existsSync(file))
    throw new Error(`${file} is missing: write the reference images with scripts/update-page-images.sh`);
  const reference = `data:image/png;base64,${readFileSync(file).toString('base64')}`;
  return difference(scratch, thumbnail.dataUrl, reference);
}
