import {
  lakeWideSuggestion,
  planForBanks,
  type LakeDay,
  type WindowPlan,
} from '../../../shared/conditions/day-plan'
import type { Bank } from '../../../shared/conditions/ranking'
import {
  AUTHORITY_CAUTION,
  VERDICT_LABELS,
  VERDICT_SHAPES,
  type Caution,
  type CautionLevel,
  type Verdict,
} from '../../../shared/conditions/safety'
import { CLARITY_LABELS } from '../../../shared/conditions/clarity'
import { PHASE_LABELS } from '../../../shared/conditions/season'
import type { TackleCall } from '../../../shared/conditions/tackle'
import { makeFormat, type Format } from '../../../shared/format'
import type { BriefUnits } from '../../../shared/schemas/brief'
import type { LakeRead } from '../../../shared/schemas/lake-read'
import { dateLabel } from '../../../shared/time'
import { logLine, withYourLog, type LogCatch, type YourLog } from '../../../shared/journal/feedback'
import { mailTemplate } from '../mail/render'

/** A followed lake as the brief sees it: cached read and day, and this subscriber's banks there. */
export interface BriefLake {
  slug: string
  name: string
  timeZone: string
  read: LakeRead | null
  /** The cached day for the brief's date; null when there is none. */
  day: LakeDay | null
  banks: Bank[]
}

export interface BriefInput {
  /** The subscriber's local date the brief is for. */
  date: string
  units: BriefUnits
  lakes: BriefLake[]
  /** The subscriber's own catches; where enough match a day, a line beside the tackle. */
  log?: LogCatch[]
  /** The app's public origin, for links. */
  origin: string
  unsubscribeUrl: string
}

/** The brief as its templates show it: every value already in words and the subscriber's units. */
export interface BriefView {
  subject: string
  preheader: string
  dateLabel: string
  lakes: LakeSection[]
  authority: string
  settingsUrl: string
  unsubscribeUrl: string
}

/** Go, caution or no-go in words and a shape, never colour alone, with the cautions that decided it. */
interface VerdictView {
  verdict: Verdict
  /** "✕ No-go: do not launch". */
  text: string
  /** "Why" for a caution or no-go, "Keep in mind" for a go. */
  reasonsLabel: string
  reasons: string[]
  /** The reasons on one line, for the text part and the preheader. */
  reasonsText: string
  noGo: boolean
  caution: boolean
}

interface CautionLine {
  /** "Danger", "Warning", "Caution". */
  level: string
  danger: boolean
  /** Names its windows ("Midday and afternoon to dusk: …"), in the subscriber's units. */
  message: string
}

interface LakeSection {
  name: string
  planUrl: string
  read: string
  /** The day's verdict; null without a plan. */
  verdict: VerdictView | null
  /** Why there is no plan today, instead of windows. */
  unavailable: string | null
  windows: WindowSection[]
  /** One line per hazard, at its worst level, naming the windows it reaches. */
  cautions: CautionLine[]
}

interface WindowSection {
  label: string
  hours: string
  wind: string
  /** Null when the forecast does not reach the window. */
  verdict: VerdictView | null
  /** What to do instead of fishing in a no-go window; its banks and tackle are left out. */
  noGo: string | null
  banks: { rank: number; name: string; exposure: string; reason: string }[]
  /** Where to start when no banks are saved on this lake. */
  suggestion: string | null
  /** The best call, and the subscriber's log beside it when it holds enough similar catches. */
  tackle: { call: string; why: string; yourLog: string | null } | null
  /** The earlier window whose banks and tackle this one repeats, which are then left out. */
  sameAs: string | null
}

const TOP_BANKS = 3

const words = (slug: string) => slug.replace(/-/g, ' ')
const capitalised = (s: string) => s.charAt(0).toUpperCase() + s.slice(1)

const NO_GO_WINDOW =
  'Do not launch in this window: no banks or tackle while it lasts. If you are out, get off the water by the shortest sheltered route.'

/** A window's go keeps its lesser cautions to the day's list, which names the windows. */
function verdictView(
  cautions: Caution[],
  f: Format,
  opts: { quietGo?: boolean } = {},
): VerdictView {
  const judged = f.verdict(cautions)
  const { verdict } = judged
  const reasons = opts.quietGo && verdict === 'go' ? [] : judged.reasons
  return {
    verdict,
    text: `${VERDICT_SHAPES[verdict]} ${VERDICT_LABELS[verdict]}`,
    reasonsLabel: verdict === 'go' ? 'Keep in mind' : 'Why',
    reasons,
    reasonsText: reasons.join('; '),
    noGo: verdict === 'no-go',
    caution: verdict === 'caution',
  }
}

const LEVEL_WORDS: Record<CautionLevel, string> = {
  danger: 'Danger',
  warning: 'Warning',
  caution: 'Caution',
  info: 'Note',
}

/** "Spinnerbait. Blades: colorado, gold. Colours: white, chartreuse. Retrieve: …", as the Day plan lists it. */
function tackleLine(call: TackleCall, f: Format): string {
  const parts = [
    call.blade && `Blades: ${words(call.blade)}${call.bladeFinish ? `, ${call.bladeFinish}` : ''}`,
    call.size && `Size: ${f.prose(call.size)}`,
    `Colours: ${call.colors.join(', ')}`,
    call.trailer !== undefined && `Trailer: ${call.trailer}`,
    call.trailerHook !== undefined && `Trailer hook: ${call.trailerHook ? 'yes' : 'no'}`,
    `Retrieve: ${call.retrieve}`,
  ].filter(Boolean)
  return [capitalised(call.family), ...parts].join('. ')
}

function readLine(read: LakeRead | null, day: LakeDay | null, f: Format): string {
  if (!read) return 'No readings from this lake yet.'
  const phase = day?.phase ?? read.phase?.phase
  const parts = [
    read.waterTemp
      ? `Water ${f.temp(read.waterTemp.valueC)}, ${f.tempTrend(read.waterTemp.trendCPerDay)}${read.waterTemp.stale ? ' (old reading)' : ''}`
      : 'No water temperature',
    read.clarity
      ? `${capitalised(CLARITY_LABELS[read.clarity.class])} (${f.length(read.clarity.secchiM)} visibility)${read.clarity.trend ? `, ${read.clarity.trend.label}` : ''}${read.clarity.stale ? ' (old reading)' : ''}`
      : 'no clarity reading',
    phase && phaseLine(phase, read, f),
  ].filter(Boolean)
  return parts.join(' · ')
}

/** "pre-spawn phase (5-day mean 55 °F)": the mean only where the read's phase is the day's. */
function phaseLine(phase: LakeDay['phase'], read: LakeRead, f: Format): string {
  const mean = read.phase?.phase === phase ? ` (5-day mean ${f.temp(read.phase.meanC)})` : ''
  return `${PHASE_LABELS[phase]} phase${mean}`
}

function lakeSection(lake: BriefLake, input: BriefInput, f: Format): LakeSection {
  const planUrl = `${input.origin}/lakes/${lake.slug}/plan/${input.date}`
  const read = readLine(lake.read, lake.day, f)
  if (!lake.day) {
    return {
      name: lake.name,
      planUrl,
      read,
      verdict: null,
      unavailable: 'No plan for today yet: the lake needs fresh readings and a forecast.',
      windows: [],
      cautions: [],
    }
  }
  const plan = withYourLog(planForBanks(lake.day, lake.banks), input.log ?? [])
  const windows = plan.windows.map((w: WindowPlan & { yourLog: YourLog | null }): WindowSection => {
    const hours = `${f.time(w.start, lake.timeZone)} – ${f.time(w.end, lake.timeZone)}`
    const none = { banks: [], suggestion: null, tackle: null, sameAs: null }
    if (!w.weather)
      return {
        label: w.label,
        hours,
        wind: 'beyond the forecast',
        verdict: null,
        noGo: null,
        ...none,
      }
    const wind = `${f.speed(w.weather.windMs)} ${f.from(w.weather.windFromDeg)}, gusts ${f.speed(w.weather.gustMs)}`
    const verdict = verdictView(w.cautions, f, { quietGo: true })
    if (verdict.noGo) return { label: w.label, hours, wind, verdict, noGo: NO_GO_WINDOW, ...none }
    const best = w.tackle[0]
    return {
      label: w.label,
      hours,
      wind,
      verdict,
      noGo: null,
      banks: w.banks.slice(0, TOP_BANKS).map((b) => {
        const strongest = [...b.components].sort((x, y) => y.points - x.points)[0]
        return {
          rank: b.rank,
          name: b.name,
          exposure: b.exposure.exposure,
          reason: strongest?.reason ?? '',
        }
      }),
      suggestion: lake.banks.length ? null : lakeWideSuggestion(w),
      tackle: best
        ? {
            call: tackleLine(best, f),
            why: f.prose(best.why.join(' ')),
            yourLog: w.yourLog && logLine(w.yourLog, f),
          }
        : null,
      sameAs: null,
    }
  })
  // A steady wind gives every window the same picks: say so rather than repeat them.
  const picks = windows.map((w) => JSON.stringify([w.banks, w.suggestion, w.tackle]))
  const shown = windows.map((w, i): WindowSection => {
    const first = picks.indexOf(picks[i]!)
    if (first === i || !w.tackle) return w
    const sameAs = windows[first]!.label.toLowerCase()
    return { ...w, banks: [], suggestion: null, tackle: null, sameAs }
  })
  return {
    name: lake.name,
    planUrl,
    read,
    verdict: verdictView(plan.cautions, f),
    unavailable: null,
    windows: shown,
    // The deferral to local authority closes the whole brief, once.
    cautions: plan.cautions
      .filter((c) => c.kind !== 'authority')
      .map((c) => ({
        level: LEVEL_WORDS[c.level],
        danger: c.level === 'danger' || c.level === 'warning',
        message: f.caution(c).message,
      })),
  }
}

/** The morning brief for one subscriber, from cached days and stored bank tables only. */
export function composeBrief(input: BriefInput): BriefView {
  const f = makeFormat({ ...input.units, homeLakeSlug: null })
  const lakes = input.lakes.map((lake) => lakeSection(lake, input, f))
  const day = dateLabel(input.date)
  const names = lakes.map((l) => l.name)
  return {
    subject: `Morning brief, ${day}: ${names.length <= 2 ? names.join(' and ') : `${names.length} lakes`}`,
    preheader: lakes
      .map((l) => `${l.name}: ${l.verdict ? `${l.verdict.text} · ` : ''}${l.read}`)
      .join(' | '),
    dateLabel: dateLabel(input.date, 'long'),
    lakes,
    authority: AUTHORITY_CAUTION.message,
    settingsUrl: `${input.origin}/settings#brief`,
    unsubscribeUrl: input.unsubscribeUrl,
  }
}

/** The brief as an e-mail: HTML and plain text from the `brief` templates. */
export const renderBrief = mailTemplate<BriefView>('brief')
