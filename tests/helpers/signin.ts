import type { Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../server/db/seed/index'

/** Signs a demo user in through the real sign-in page. */
export async function signInAs(page: Page, base: string, email: string) {
  await page.goto(`${base}/signin`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(DEMO_PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL(`${base}/lakes`)
}
