import { execFileSync } from 'node:child_process'
import { existsSync } from 'node:fs'
import { CHROMIUM_PATH } from '../helpers/browser'

const APT_INSTALL = 'apt-get update && apt-get install -y --no-install-recommends chromium'

/**
 * The e2e tests drive Debian's Chromium. Missing, it is installed when the tests run as root (as
 * `npm start` installs PostgreSQL); otherwise the run stops at once with the one command to run,
 * rather than failing inside the first test that opens a page.
 */
export default function setup() {
  if (existsSync(CHROMIUM_PATH)) return
  if (process.getuid?.() !== 0)
    throw new Error(
      `Chromium not found at ${CHROMIUM_PATH}; the e2e tests need it. Install it with:\n  sudo sh -c '${APT_INSTALL}'`,
    )
  console.log(`Chromium not found; installing Debian's package: ${APT_INSTALL}`)
  execFileSync('sh', ['-c', APT_INSTALL], { stdio: 'inherit' })
  if (!existsSync(CHROMIUM_PATH))
    throw new Error(`Chromium was installed but ${CHROMIUM_PATH} is not there.`)
}
