import AxeBuilder from '@axe-core/playwright';
import type { Page } from '@playwright/test';

/** WCAG 2.2 level A and AA, every version's rules (2.1 A holds 2.5.3, label in name). */
export const WCAG_22_AA = ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22a', 'wcag22aa'];

/** One line per failing element, so a test's diff names the rule, the element and what is wrong. */
// Legacy mode runs axe in the page itself: no blank page per run, and the app has no frames.
export async function axeViolations(page: Page, where = new URL(page.url()).pathname): Promise<string[]> {
  const { violations } = await new AxeBuilder({ page }).withTags(WCAG_22_AA).setLegacyMode().analyze();
  return violations.flatMap((v) =>
    v.nodes.map((n) => `${where} · ${v.id} (${v.impact}): ${n.target.join(' ')} · ${n.failureSummary?.split('\n').slice(0, 2).join(' ').trim() ?? v.help}`),
  );
}

/**
 * Opens every closed <details> on the page: axe skips what is hidden, and a disclosure's content
 * (a report's working, a filter panel) is where a fault would sit unseen.
 */
export async function openDisclosures(page: Page): Promise<number> {
  return page.evaluate(() => {
    // Not the phone's menu: open, it lies over the page by design, so every target under it would
    // read as obscured. tests/e2e/field-phone.spec.ts checks the page with the menu open on its own.
    const closed = [...document.querySelectorAll('details:not([open]):not([data-testid="phone-menu"])')];
    for (const d of closed) (d as HTMLDetailsElement).open = true;
    return closed.length;
  });
}

/** The page as it loads, then with its disclosures open when it has any. */
export async function pageViolations(page: Page, where?: string): Promise<string[]> {
  const found = await axeViolations(page, where);
  if ((await openDisclosures(page)) > 0) found.push(...(await axeViolations(page, `${where ?? new URL(page.url()).pathname} (disclosures open)`)));
  return [...new Set(found)];
}
