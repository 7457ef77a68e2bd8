/**
 * Layout faults a person would see, found in the page as it is drawn: the page wider than
 * the window (a sideways scroll bar), text cut off by its box, and controls drawn on top of
 * one another. Only visible elements count; text a screen reader alone reads
 * (`.visually-hidden`) is left out.
 */
import type { Page } from 'playwright-core';

export interface LayoutFault {
  kind: 'page wider than the window' | 'clipped text' | 'overlapping controls';
  where: string;
}

/**
 * Finds the layout faults of the page as it is now.
 *
 * @param page - a loaded page
 * @returns every fault found, with a short description of where
 */
export function layoutFaults(page: Page): Promise<LayoutFault[]> {
  return page.evaluate(() => {
    const faults: { kind: LayoutFault['kind']; where: string }[] = [];
    const describe = (element: Element): string => {
      const id = element.id ? `#${element.id}` : '';
      const text = (element.textContent ?? '').trim().replace(/\s+/g, ' ').slice(0, 40);
      return `${element.tagName.toLowerCase()}${id} “${text}”`;
    };
    const shown = (element: Element): boolean => {
      if (element.closest('.visually-hidden, [hidden], dialog:not([open])')) return false;
      const box = element.getBoundingClientRect();
      const style = getComputedStyle(element);
      return box.width > 0 && box.height > 0 && style.visibility !== 'hidden';
    };

    const root = document.scrollingElement ?? document.documentElement;
    if (root.scrollWidth > window.innerWidth + 1) {
      faults.push({
        kind: 'page wider than the window',
        where: `${root.scrollWidth} px of content in a ${window.innerWidth} px window`,
      });
    }

    // Text cut off: a box that hides its overflow, with more text than room (an ellipsis
    // is a choice made on purpose and is marked by text-overflow).
    for (const element of document.querySelectorAll('body *')) {
      if (!shown(element) || !(element instanceof HTMLElement)) continue;
      if (element instanceof HTMLInputElement || element instanceof HTMLSelectElement) continue;
      if (element instanceof HTMLCanvasElement || element.tagName === 'svg') continue;
      const style = getComputedStyle(element);
      const hides =
        style.overflowX === 'hidden' || style.overflowY === 'hidden' || style.overflow === 'clip';
      if (!hides || style.textOverflow === 'ellipsis') continue;
      const hasText = [...element.childNodes].some(
        (node) => node.nodeType === Node.TEXT_NODE && (node.textContent ?? '').trim() !== '',
      );
      if (!hasText) continue;
      if (
        element.scrollWidth > element.clientWidth + 1 ||
        element.scrollHeight > element.clientHeight + 1
      ) {
        faults.push({ kind: 'clipped text', where: describe(element) });
      }
    }

    // Controls on top of one another.
    const controls = [
      ...document.querySelectorAll('button, input, select, textarea, a[href], summary'),
    ].filter(
      (element) =>
        shown(element) && !(element instanceof HTMLInputElement && element.type === 'hidden'),
    );
    const boxes = controls.map((element) => ({ element, box: element.getBoundingClientRect() }));
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i];
        const b = boxes[j];
        if (a === undefined || b === undefined) continue;
        // A control inside another (a link in a button's label) is not an overlap.
        if (a.element.contains(b.element) || b.element.contains(a.element)) continue;
        // A radio or check box and the label around it sit together by design.
        const labelA = a.element.closest('label');
        if (labelA !== null && labelA === b.element.closest('label')) continue;
        const overlapX = Math.min(a.box.right, b.box.right) - Math.max(a.box.left, b.box.left);
        const overlapY = Math.min(a.box.bottom, b.box.bottom) - Math.max(a.box.top, b.box.top);
        if (overlapX > 2 && overlapY > 2) {
          faults.push({
            kind: 'overlapping controls',
            where: `${describe(a.element)} and ${describe(b.element)}`,
          });
        }
      }
    }
    return faults;
  });
}
