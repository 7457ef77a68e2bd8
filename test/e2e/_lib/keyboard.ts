/** Moving through a page by keyboard alone, as a person without a mouse would. */
import type { Locator, Page } from 'playwright-core';

/**
 * Presses Tab until `target` has the focus.
 *
 * @param page - the page
 * @param target - the element to reach
 * @param maxPresses - how many presses to allow before giving up
 * @returns how many presses it took
 * @throws when the element is not reached within `maxPresses`
 */
export async function tabTo(page: Page, target: Locator, maxPresses = 60): Promise<number> {
  for (let presses = 0; presses <= maxPresses; presses++) {
    if (await target.evaluate((element) => element === document.activeElement)) return presses;
    await page.keyboard.press('Tab');
  }
  throw new Error(`Tab did not reach ${target.toString()} in ${maxPresses} presses`);
}

/** Whether the focused element shows a visible focus ring (an outline of 2 px or more). */
export function focusRingShown(page: Page): Promise<boolean> {
  return page.evaluate(() => {
    const element = document.activeElement;
    if (!(element instanceof HTMLElement)) return false;
    const style = getComputedStyle(element);
    return (
      element.matches(':focus-visible') &&
      style.outlineStyle !== 'none' &&
      Number.parseFloat(style.outlineWidth) >= 2
    );
  });
}
