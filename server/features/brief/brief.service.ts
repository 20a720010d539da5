import type {
  BriefDelivery,
  BriefSettings,
  BriefSettingsView,
  CaughtMail,
} from '../../../shared/schemas/brief'
import { HOUR_MS } from '../../../shared/time'
import { conflict, invalid, invalidLink, unauthenticated, unavailable } from '../../http/errors'
import { signLinkToken, verifyLinkToken, type TokenKey } from '../auth/auth.tokens'
import type { MailContext } from '../mail/mailer'
import type { BriefSendsRepo } from './brief-sends.repo'
import type { BriefRepo } from './brief.repo'
import { mailTemplate } from '../mail/render'

/** The local SMTP stand-in's catch, which the development inbox lists. */
export interface Mailbox {
  messages(): readonly CaughtMail[]
  message(id: number): CaughtMail | undefined
}

const VERIFY_HOURS = 24
const renderVerification = mailTemplate<{
  subject: string
  email: string
  url: string
  hours: number
}>('verify')

export function briefService(deps: {
  repo: BriefRepo
  sends: BriefSendsRepo
  mail: MailContext
  linkKey: TokenKey
  now?: () => Date
}) {
  const { repo, mail, linkKey } = deps
  const now = () => deps.now?.() ?? new Date()

  async function view(userId: string): Promise<BriefSettingsView> {
    const found = await repo.view(userId)
    if (!found.user) throw unauthenticated()
    return {
      settings: found.settings,
      email: found.user.email,
      emailVerified: found.user.verifiedAt !== null,
      lakes: found.lakes,
    }
  }

  return {
    view,

    async save(userId: string, settings: BriefSettings): Promise<BriefSettingsView> {
      const followed = settings.lakes && (await repo.followedSlugs(userId, settings.lakes))
      if (settings.lakes && followed!.length !== settings.lakes.length)
        throw invalid('lakes', 'Choose from the lakes you follow.')
      await repo.save(userId, settings)
      return view(userId)
    },

    /** E-mails a signed link that confirms the address; it names the address, so a changed one needs a new link. */
    async sendVerification(userId: string): Promise<{ sentTo: string }> {
      const { email, emailVerified } = await view(userId)
      if (emailVerified) throw conflict('already_verified', `${email} is already confirmed.`)
      const token = await signLinkToken(linkKey, {
        purpose: 'verify-email',
        subject: userId,
        claims: { email },
        expiresAt: new Date(now().getTime() + VERIFY_HOURS * HOUR_MS),
      })
      try {
        await mail.mailer.send({
          to: email,
          ...renderVerification({
            subject: 'Confirm your address for the Chopline morning brief',
            email,
            url: `${mail.origin}/verify-email?token=${token}`,
            hours: VERIFY_HOURS,
          }),
        })
      } catch {
        throw unavailable(
          'mail_unavailable',
          'The confirmation e-mail could not be sent just now. Try again in a few minutes.',
        )
      }
      return { sentTo: email }
    },

    async verify(token: string): Promise<{ email: string }> {
      const link = await verifyLinkToken(linkKey, 'verify-email', token)
      const email = link?.claims.email
      if (!link || typeof email !== 'string')
        throw invalidLink('Ask for a new confirmation link from Settings.')
      if (!(await repo.markVerified(link.subject, email, now())))
        throw invalidLink('Ask for a new confirmation link from Settings.')
      return { email }
    },

    /** One-click unsubscribe: turns the brief off; the followed lakes stay followed. */
    async unsubscribe(token: string): Promise<void> {
      const link = await verifyLinkToken(linkKey, 'brief-unsubscribe', token)
      if (!link) throw invalidLink('Turn the brief off from Settings instead.')
      await repo.disable(link.subject)
    },

    undelivered: (status?: BriefDelivery['status']) => deps.sends.undelivered(status),
  }
}
export type BriefService = ReturnType<typeof briefService>
