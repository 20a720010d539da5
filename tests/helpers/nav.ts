import type { Page } from 'playwright-core'

/**
 * Follows a link of the main navigation as a person would: from the bar, or on a phone, where
 * the bar keeps its first links, from the "More" menu.
 */
export async function openFromNav(page: Page, name: string) {
  const nav = page.getByRole('navigation', { name: 'Main' })
  const inBar = nav.getByRole('link', { name, exact: true })
  if (!(await inBar.isVisible())) await nav.getByRole('button', { name: 'More' }).click()
  await nav.getByRole('link', { name, exact: true }).click()
}
