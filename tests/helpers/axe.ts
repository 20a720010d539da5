import AxeBuilder from '@axe-core/playwright'
import { expect } from 'vitest'
import type { Page } from 'playwright-core'

/**
 * axe-core's WCAG 2.1 A/AA checks on the page as it stands; the serious and critical findings.
 * Sandboxed frames (a caught e-mail) are left out: axe cannot run inside them and would wait.
 */
export async function seriousViolations(page: Page) {
  const { violations } = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'])
    .exclude('iframe[sandbox]')
    .analyze()
  return violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id}: ${v.help} (${v.nodes.map((n) => n.target.join(' ')).join('; ')})`)
}

/** Fails the test with the findings when the page has serious or critical ones. */
export async function expectAccessible(page: Page, name: string) {
  // A toast mid-fade has no settled colours to judge.
  await page.locator('.n-message').waitFor({ state: 'detached' })
  expect(await seriousViolations(page), name).toEqual([])
}
