import { WINDOW_LABELS, type WindowId } from '../../../shared/conditions/day-plan'
import { CLARITY_LABELS } from '../../../shared/conditions/clarity'
import { PHASE_LABELS } from '../../../shared/conditions/season'
import { VERDICT_LABELS } from '../../../shared/conditions/safety'
import type { TripAlarm, WatchMatch } from '../../../shared/conditions/watch'
import { makeFormat } from '../../../shared/format'
import { dateLabel } from '../../../shared/time'
import { mailTemplate } from '../mail/render'
import type { AlertToSend } from './watch.repo'

/** An alert in words, in its owner's units: the same words go by mail and by push. */
export interface AlertView {
  subject: string
  heading: string
  preheader: string
  intro: string
  lines: string[]
  url: string
  linkText: string
  note: string
  watchName: string
  unsubscribeUrl: string
  /** RFC 8058 one-click: the `List-Unsubscribe` header's URL. */
  oneClickUrl: string
}

const EXPOSURE_WORDS = {
  lee: 'in the lee',
  'side wind': 'across it',
  windward: 'onto it',
  rough: 'onto it, rough',
} as const

/** The words of a claimed alert; `origin` for its links, `stop` signed for its watch. */
export function composeAlert(
  alert: AlertToSend,
  origin: string,
  stop: { page: string; oneClick: string },
): AlertView {
  const unsubscribe = { unsubscribeUrl: stop.page, oneClickUrl: stop.oneClick }
  const f = makeFormat({ ...alert.units, homeLakeSlug: null })
  const day = dateLabel(alert.date, 'long')
  if (alert.kind === 'trip') {
    const alarm = alert.match as unknown as TripAlarm
    const verdict = VERDICT_LABELS[alarm.verdict]
    return {
      subject: `Trip on ${dateLabel(alert.date)} at ${alert.lakeName}: ${alarm.verdict === 'no-go' ? 'no-go' : 'danger in the forecast'}`,
      heading: `Your trip day turned ${alarm.verdict === 'no-go' ? 'no-go' : 'dangerous'}`,
      preheader: `${alert.lakeName}, ${day}: ${verdict}`,
      intro: `The latest forecast for your trip on ${alert.lakeName} on ${day} reads: ${verdict}.`,
      lines: alarm.dangers.length ? alarm.dangers : ['The day as a whole is judged a no-go.'],
      url: `${origin}/guide/trips/${alert.tripId}`,
      linkText: 'Open the trip',
      note: 'The trip page has the plan as it stands; from there you can send your clients a note. Always defer to local authorities and boating law.',
      watchName: alert.watchName,
      ...unsubscribe,
    }
  }
  const match = alert.match as unknown as WatchMatch
  const window = WINDOW_LABELS[alert.windowId as WindowId] ?? alert.windowId
  const wind = `Wind ${f.speed(match.windMs)} ${f.from(match.windFromDeg)}`
  return {
    subject: `${alert.watchName}: ${window.toLowerCase()} on ${dateLabel(alert.date)} matches`,
    heading: `${alert.watchName} matches`,
    preheader: `${alert.lakeName}, ${day}, ${window.toLowerCase()}`,
    intro: `${window} on ${day} at ${alert.lakeName}${alert.bankName ? `, ${alert.bankName}` : ''} meets your watch:`,
    lines: [
      match.exposure && alert.bankName
        ? `${wind}, ${EXPOSURE_WORDS[match.exposure]} at ${alert.bankName}`
        : wind,
      `Water ${CLARITY_LABELS[match.clarity]}`,
      `Phase: ${PHASE_LABELS[match.phase]}`,
      `Verdict: ${VERDICT_LABELS[match.verdict]}`,
    ],
    url: `${origin}/lakes/${alert.lakeSlug}/plan/${alert.date}#window-${alert.windowId}`,
    linkText: 'Open the Day plan',
    note: 'Told once for this window. If the forecast changes so it no longer matches, you hear nothing more unless it matches again.',
    watchName: alert.watchName,
    ...unsubscribe,
  }
}

export const renderAlert = mailTemplate<AlertView>('watch-alert')
