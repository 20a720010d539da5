import { startMailServer } from '../../server/fakes/mail/index'
import { smtpMailer } from '../../server/features/mail/mailer'

export const TEST_ORIGIN = 'http://app.test'

/** The local SMTP stand-in on a free port, and a mailer that sends to it. */
export async function startTestMail() {
  const smtp = await startMailServer()
  const mailer = smtpMailer(smtp.url, 'Chopline <brief@chopline.example>')
  return {
    smtp,
    mail: { mailer, origin: TEST_ORIGIN },
    close: async () => {
      mailer.close()
      await smtp.close()
    },
  }
}
export type TestMail = Awaited<ReturnType<typeof startTestMail>>

/** The token of a link in a message: the `token` query parameter of the first URL starting with `prefix`. */
export function linkToken(text: string, prefix: string): string {
  const at = text.indexOf(prefix)
  if (at < 0) throw new Error(`no link starting ${prefix} in:\n${text}`)
  const url = new URL(text.slice(at).split(/[\s>"]/)[0]!)
  return url.searchParams.get('token')!
}
