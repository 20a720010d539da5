import { DomainError } from '../errors'
import type { LakeGeometry, Position } from '../geo/types'
import { CLARITY_LABELS, type ClarityClass } from './clarity'
import {
  bankExposure,
  exposureTable,
  ROUGH_WAVE_M,
  type BankExposure,
  type ExposureTable,
} from './exposure'
import { WAVE_M, WIND_MS } from './safety'
import { PHASE_LABELS, type SeasonalPhase } from './season'
import { COVER_LABELS, type Cover, type Sky } from './tackle-rules'
import { wordList } from '../words'

export interface Bank {
  id: string
  name: string
  /** Two or more points along the shoreline. */
  points: Position[]
  cover: Cover[]
  depthM?: number
  /** Stored when the bank is saved; computed here when absent. */
  exposure?: ExposureTable
}

export interface WindowWeather {
  windFromDeg: number
  windMs: number
  gustMs: number
  sky: Sky
  /** Low sun (dawn, dusk) rather than midday light. */
  lowLight?: boolean
  /** The window's strongest wind, for safety; the typical wind above stands in when absent. */
  peak?: { windFromDeg: number; windMs: number; gustMs: number }
}

export interface RankConditions {
  clarity: ClarityClass
  waterC: number
  phase: SeasonalPhase
}

export type ScoreKey = 'wind' | 'cover' | 'depth' | 'clarity' | 'light' | 'safety'

export interface ScoreComponent {
  key: ScoreKey
  points: number
  reason: string
}

/**
 * How safe a bank is to fish in the window's strongest wind: rough where a chop a small boat feels
 * (1 ft) builds or force 7 gusts blow onto it, danger where waves reach 2 ft or gale-force gusts
 * blow onto it. Banks rank by this first: in a blow every sheltered bank comes before a rough one.
 */
export type BankSafety = 'ok' | 'rough' | 'danger'

export interface RankedBank {
  id: string
  name: string
  rank: number
  /** The sum of the components' points. */
  score: number
  components: ScoreComponent[]
  /** In the window's typical wind. */
  exposure: BankExposure
  safety: BankSafety
  /** Waves at the bank in the window's strongest wind. */
  peakWaveHeightM: number
}

/** Cover each phase favours (common practice), 1 = prime. */
const PHASE_COVER: Record<SeasonalPhase, Partial<Record<Cover, number>>> = {
  winter: { rock: 1, wood: 0.5 },
  'early-pre-spawn': { wood: 1, 'sparse-grass': 1, rock: 1 },
  'pre-spawn': { rock: 1, 'sparse-grass': 1, wood: 1 },
  spawn: { 'sparse-grass': 1, docks: 1, wood: 0.5 },
  'post-spawn': { docks: 1, wood: 0.5, 'sparse-grass': 0.5 },
  summer: { 'dense-grass': 1, docks: 1, rock: 1 },
  fall: { wood: 1, 'sparse-grass': 1, rock: 0.5 },
}

/** Depth a cast off the bank that suits each phase, metres (common practice; about 10 ft before the spawn). */
const PHASE_DEPTH_M: Record<SeasonalPhase, [number, number]> = {
  winter: [4, 9],
  'early-pre-spawn': [2, 4],
  'pre-spawn': [2, 4],
  spawn: [0.5, 2],
  'post-spawn': [1.5, 4],
  summer: [3, 7],
  fall: [1, 3.5],
}

const SHADE: Cover[] = ['docks', 'dense-grass', 'wood']

function windPoints(x: BankExposure, w: WindowWeather, c: RankConditions): ScoreComponent {
  const calmColdSun = c.phase === 'early-pre-spawn' && w.windMs < 2.5 && w.sky === 'sun'
  if (calmColdSun) {
    return x.exposure === 'lee'
      ? {
          key: 'wind',
          points: 1,
          reason: 'Calm, sunny early pre-spawn: sheltered water warms first.',
        }
      : { key: 'wind', points: 0.5, reason: 'Calm day; little wind reaches any bank.' }
  }
  switch (x.exposure) {
    case 'windward': {
      const strength = w.windMs >= 2.5 ? 1 : 0.5
      return {
        key: 'wind',
        points: 2 * x.onshore * strength,
        reason: 'Wind blows onto this bank and stirs bait along it.',
      }
    }
    case 'rough':
      return {
        key: 'wind',
        points: 1,
        reason: 'Wind onto the bank, but the waves there make it hard to fish.',
      }
    case 'side wind':
      return { key: 'wind', points: 0.5, reason: 'Wind runs along this bank.' }
    case 'lee':
      return { key: 'wind', points: 0, reason: 'Sheltered from the wind.' }
  }
}

function coverPoints(bank: Bank, c: RankConditions): ScoreComponent {
  const favoured = PHASE_COVER[c.phase]
  const scores = bank.cover.map((cover) => favoured[cover] ?? 0).sort((a, b) => b - a)
  const points = (scores[0] ?? 0) + 0.25 * scores.slice(1).reduce((a, b) => a + b, 0)
  const best = bank.cover.filter((cover) => (favoured[cover] ?? 0) >= 1)
  const phase = PHASE_LABELS[c.phase]
  return {
    key: 'cover',
    points,
    reason: best.length
      ? `${coverInWords(best)} ${best.length === 1 ? 'suits' : 'suit'} the ${phase} phase.`
      : `Cover here is not what the ${phase} phase favours.`,
  }
}

/** "Rock", "Rock and sparse grass", "Wood / laydowns, rock and docks". */
function coverInWords(covers: Cover[]): string {
  const words = covers.map((cover, i) =>
    i === 0 ? COVER_LABELS[cover] : COVER_LABELS[cover].toLowerCase(),
  )
  return wordList(words)
}

function depthPoints(bank: Bank, c: RankConditions): ScoreComponent {
  if (bank.depthM === undefined)
    return { key: 'depth', points: 0, reason: 'Depth off the bank not recorded.' }
  const [lo, hi] = PHASE_DEPTH_M[c.phase]
  const off = bank.depthM < lo ? lo - bank.depthM : bank.depthM > hi ? bank.depthM - hi : 0
  const points = off === 0 ? 1 : off <= 1 ? 0.5 : 0
  // No numbers in the words: reasons are shown in every angler's units, so they name none.
  const fit =
    off === 0 ? 'suits' : bank.depthM < lo ? 'is shallower than suits' : 'is deeper than suits'
  return {
    key: 'depth',
    points,
    reason: `Depth a cast out ${fit} the ${PHASE_LABELS[c.phase]} phase.`,
  }
}

function clarityPoints(bank: Bank, x: BankExposure, c: RankConditions): ScoreComponent {
  const dirty = c.clarity === 'stained' || c.clarity === 'muddy'
  if (dirty && bank.cover.some((cover) => cover !== 'open' && cover !== 'rock')) {
    return {
      key: 'clarity',
      points: 0.5,
      reason: 'Stained water pulls fish tight to shallow cover.',
    }
  }
  if (!dirty && x.onshore > 0.34 && x.exposure !== 'lee') {
    return { key: 'clarity', points: 0.5, reason: 'A ripple on clear water makes fish less wary.' }
  }
  return {
    key: 'clarity',
    points: 0,
    reason: `The clarity (${CLARITY_LABELS[c.clarity]}) neither helps nor hurts here.`,
  }
}

function lightPoints(bank: Bank, w: WindowWeather): ScoreComponent {
  if (w.lowLight || w.sky === 'overcast') {
    return { key: 'light', points: 0.5, reason: 'Low light lets fish roam the bank.' }
  }
  if (w.sky === 'sun' && bank.cover.some((cover) => SHADE.includes(cover))) {
    return { key: 'light', points: 0.5, reason: 'Bright sun: shade under this cover holds fish.' }
  }
  return { key: 'light', points: 0, reason: 'Light is neutral here.' }
}

const SAFETY_ORDER: Record<BankSafety, number> = { ok: 0, rough: 1, danger: 2 }

function bankSafety(peak: BankExposure, gustMs: number): BankSafety {
  const onto = peak.onshore > 0.34
  if (peak.waveHeightM >= WAVE_M.warning || (onto && gustMs >= WIND_MS.gustDanger)) return 'danger'
  if (peak.waveHeightM >= ROUGH_WAVE_M || (onto && gustMs >= WIND_MS.gustWarning)) return 'rough'
  return 'ok'
}

function safetyPoints(safety: BankSafety): ScoreComponent {
  if (safety === 'danger')
    return {
      key: 'safety',
      points: -3,
      reason:
        'In the strongest wind, waves or gusts here can swamp a small boat: fish sheltered banks first.',
    }
  if (safety === 'rough')
    return {
      key: 'safety',
      points: -1,
      reason: 'In the strongest wind a chop or gusts a small boat feels build on this bank.',
    }
  return { key: 'safety', points: 0, reason: 'No safety concern from wind or waves here.' }
}

function requireLake(lake: LakeGeometry | undefined): LakeGeometry {
  if (!lake)
    throw new DomainError(
      'invalid_geometry',
      'A bank without an exposure table needs the lake.',
      'lake',
    )
  return lake
}

/**
 * Saved banks ranked for one window of wind and light: safe banks first, then by score, the sum of
 * named components.
 */
export function rankBanks(input: {
  /** Needed only for banks without a stored exposure table. */
  lake?: LakeGeometry
  banks: Bank[]
  window: WindowWeather
  conditions: RankConditions
}): RankedBank[] {
  const { lake, banks, window: w, conditions: c } = input
  const ranked = banks.map((bank) => {
    const table = bank.exposure ?? exposureTable(requireLake(lake), bank.points)
    const x = bankExposure(table, w.windFromDeg, w.windMs)
    const peak = w.peak ? bankExposure(table, w.peak.windFromDeg, w.peak.windMs) : x
    const safety = bankSafety(peak, w.peak?.gustMs ?? w.gustMs)
    const components = [
      windPoints(x, w, c),
      coverPoints(bank, c),
      depthPoints(bank, c),
      clarityPoints(bank, x, c),
      lightPoints(bank, w),
      safetyPoints(safety),
    ]
    const score = components.reduce((sum, part) => sum + part.points, 0)
    return {
      id: bank.id,
      name: bank.name,
      rank: 0,
      score,
      components,
      exposure: x,
      safety,
      peakWaveHeightM: peak.waveHeightM,
    }
  })
  ranked.sort(
    (a, b) =>
      SAFETY_ORDER[a.safety] - SAFETY_ORDER[b.safety] ||
      b.score - a.score ||
      a.name.localeCompare(b.name),
  )
  ranked.forEach((r, i) => (r.rank = i + 1))
  return ranked
}
