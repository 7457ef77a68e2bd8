/**
 * What a person sees drawn and printed: how much of a chart's canvas holds paint, and the
 * text of a PDF as poppler's pdftotext reads it (Debian's poppler-utils; `.ci/run` installs
 * it when it is missing).
 */
import { execFileSync } from 'node:child_process';
import type { Page } from 'playwright-core';

/** How many pixels of a canvas hold paint (alpha above zero): an empty chart has none. */
export function paintedPixels(page: Page, selector: string): Promise<number> {
  return page.locator(selector).evaluate((canvas) => {
    const element = canvas as HTMLCanvasElement;
    const context = element.getContext('2d');
    if (context === null) return 0;
    const { data } = context.getImageData(0, 0, element.width, element.height);
    let painted = 0;
    for (let index = 3; index < data.length; index += 4) if ((data[index] ?? 0) > 0) painted++;
    return painted;
  });
}

/** Fails with the install line when one of poppler's tools is missing. */
export function requireTool(name: 'pdftotext' | 'pdftoppm' | 'pdfinfo'): void {
  try {
    execFileSync('which', [name], { stdio: 'pipe' });
  } catch {
    throw new Error(`${name} is not installed: apt-get install -y poppler-utils`);
  }
}

/** A text with every run of white space folded to one space. */
export function folded(text: string | null): string {
  return (text ?? '').replace(/\s+/g, ' ').trim();
}

/**
 * Whether `text` holds `figure` as a whole figure: "$130" is not found in "$1,306" or "$130.50".
 */
export function holdsFigure(text: string, figure: string): boolean {
  const escaped = figure.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return new RegExp(`(^|[\\s(])${escaped}(?![\\d]|[.,]\\d)`).test(text);
}

/** The text of each page of a PDF (pdftotext, layout kept), white space folded. */
export function pdfPages(pdfPath: string): string[] {
  requireTool('pdftotext');
  const text = execFileSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' });
  return text.split('\f').map(folded);
}
