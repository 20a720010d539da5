import type { ClarityClass } from './clarity'
import { WIND_MS } from './safety'
import type { SeasonalPhase } from './season'

export const COVERS = ['wood', 'sparse-grass', 'dense-grass', 'rock', 'docks', 'open'] as const
export type Cover = (typeof COVERS)[number]
/** Cover in words, as a person reads it (the keys never reach a screen or a mail). */
export const COVER_LABELS: Record<Cover, string> = {
  wood: 'Wood / laydowns',
  'sparse-grass': 'Sparse grass',
  'dense-grass': 'Dense grass',
  rock: 'Rock',
  docks: 'Docks',
  open: 'Open bank',
}

export type LureFamily =
  | 'spinnerbait'
  | 'squarebill crankbait'
  | 'lipless crankbait'
  | 'jerkbait'
  | 'jig'
  | 'soft-plastic worm'
  | 'topwater'
  | 'swimbait'
  | 'bladed jig'

export type Blade = 'colorado' | 'willow' | 'indiana' | 'willow-colorado' | 'double-willow'
export type Sky = 'sun' | 'partly' | 'overcast'

/** The sky in words. */
export const SKY_LABELS: Record<Sky, string> = {
  sun: 'sunny',
  partly: 'partly cloudy',
  overcast: 'overcast',
}

export interface TackleInput {
  clarity: ClarityClass
  waterC: number
  phase: SeasonalPhase
  windMs: number
  sky: Sky
  cover: Cover[]
  /** Water depth a cast off the bank, metres. */
  depthM?: number
  /**
   * A cold front passed in the last day: pressure rising fast after a fall, the wind veered to the
   * north-west, often a bright blue sky behind it. Fish tuck tight to cover and bite slowly.
   */
  coldFrontPassed?: boolean
}

export interface TackleDetails {
  blade?: Blade
  bladeFinish?: string
  size?: string
  colors: string[]
  trailer?: string
  trailerHook?: boolean
  retrieve: string
}

/**
 * A row of the tackle table. A `fit` row decides that the family suits the day and by how much;
 * a detail row (no fit) only sets how to rig and fish it. Later rows override earlier ones.
 */
export interface TackleRule {
  id: string
  family: LureFamily
  when: (x: TackleInput) => boolean
  fit?: number
  /** The family does not suit this water at all: no call, whatever else matched. */
  rulesOut?: true
  set?: Partial<TackleDetails>
  why: string
  source: 'common practice' | 'from memory'
}

const dirty = (x: TackleInput) => x.clarity === 'stained' || x.clarity === 'muddy'
const clearish = (x: TackleInput) =>
  x.clarity === 'clear' || x.clarity === 'very-clear' || x.clarity === 'lightly-stained'
const has = (x: TackleInput, ...covers: Cover[]) => covers.some((c) => x.cover.includes(c))
const inPhase = (x: TackleInput, ...phases: SeasonalPhase[]) => phases.includes(x.phase)
/** Wind that breaks the surface: about 2.5 m/s (light breeze, Beaufort 2) and up. */
export const SURFACE_BREAKING_WIND_MS = 2.5
const breezy = (x: TackleInput) => x.windMs >= SURFACE_BREAKING_WIND_MS
/**
 * Sustained wind at or above which no bait is worth the risk: the lower bound of WMO Beaufort
 * force 6 ("strong breeze", 22 kt), where the wind caution calls a danger for small boats.
 */
export const NO_FISHING_WIND_MS = WIND_MS.danger
/** The prime blade-bait depth a cast off the bank: about 10 ft. */
export const PRIME_DEPTH_M = 3
/** Deep enough, well past the prime depth, that a blade bait is slow-rolled along the bottom. */
export const DEEP_SLOW_ROLL_M = 4.5
/** A squarebill runs 1-1.5 m deep: over more water than this it touches neither bottom nor cover. */
export const SQUAREBILL_MAX_DEPTH_M = 3
/** Below about 46 °F fish will not chase a fast, deflecting crankbait. */
export const SQUAREBILL_MIN_WATER_C = 8

const coldEarlySpring = (x: TackleInput) => x.phase === 'early-pre-spawn' && x.waterC < 12
/** No cover at all: an open bank, or open water when the angler has no banks saved. */
const openOnly = (x: TackleInput) => x.cover.every((c) => c === 'open')
const coldFront = (x: TackleInput) => x.coldFrontPassed === true
/**
 * The prime blade-bait bank: windblown, rock or sparse grass (not dense grass), about 10 ft of
 * water a cast out, so not yet deep.
 */
const primeBladeBank = (x: TackleInput) =>
  breezy(x) &&
  has(x, 'rock', 'sparse-grass') &&
  !has(x, 'dense-grass') &&
  (x.depthM === undefined || x.depthM < DEEP_SLOW_ROLL_M)
const midClarity = (x: TackleInput) => x.clarity === 'lightly-stained' || x.clarity === 'clear'
const veryClear = (x: TackleInput) => x.clarity === 'very-clear'

/** How each family is rigged before any detail row applies. */
export const FAMILY_DEFAULTS: Record<LureFamily, TackleDetails> = {
  spinnerbait: {
    blade: 'double-willow',
    bladeFinish: 'gold and silver',
    size: '3/8 oz',
    colors: ['white'],
    trailerHook: false,
    retrieve: 'erratic: twitches, pauses, and let it fall beside cover',
  },
  'squarebill crankbait': {
    size: '1.5 size, runs 1-1.5 m',
    colors: ['shad'],
    retrieve: 'bang it off cover and pause after each contact',
  },
  'lipless crankbait': {
    size: '1/2 oz',
    colors: ['chrome shad'],
    retrieve: 'yo-yo: rip it free of the grass and let it fall',
  },
  jerkbait: {
    size: '110 mm suspending',
    colors: ['ghost shad'],
    retrieve: 'twitch-twitch-pause; the colder the water, the longer the pause',
  },
  jig: {
    size: '3/8-1/2 oz',
    colors: ['green pumpkin'],
    trailer: 'craw',
    retrieve: 'pitch to cover, then hop and drag along the bottom',
  },
  'soft-plastic worm': {
    size: '7 in, Texas-rigged',
    colors: ['green pumpkin'],
    retrieve: 'slow drag and lift; let it settle by cover',
  },
  topwater: {
    size: 'walking bait, 100-125 mm',
    colors: ['bone'],
    retrieve: 'walk it with pauses beside cover and shade',
  },
  swimbait: {
    size: '3.5-4.5 in paddle tail',
    colors: ['natural shad'],
    retrieve: 'steady and slow, just above the grass or along breaks',
  },
  'bladed jig': {
    size: '3/8 oz',
    colors: ['white'],
    trailer: 'swimbait',
    retrieve: 'tick the top of the grass; rip it free when it hangs',
  },
}

const COLD_FRONT_WHY = 'A cold front just passed: fish tuck tight to cover; slow down.'
const COLD_FRONT_OPEN_WHY =
  'No cover here: after the front, fish hold tight to the bottom on points and breaks.'
const DIRTY_COLORS_WHY = 'Dirty water: bright or dark colours make a silhouette fish can find.'
const MID_COLORS_WHY = 'Lightly stained to clear water: natural baitfish and craw colours.'
const VERY_CLEAR_COLORS_WHY =
  'Very clear water: fish get a good look, so natural, translucent colours.'

const rule = (r: Omit<TackleRule, 'source'>): TackleRule => ({ ...r, source: 'common practice' })

/** A family's colours in lightly stained to clear water, and in very clear water (common practice). */
function clarityColours(
  family: LureFamily,
  prefix: string,
  mid: string[],
  clearest: string[],
): TackleRule[] {
  return [
    rule({
      id: `${prefix}-colors-clear`,
      family,
      when: midClarity,
      set: { colors: mid },
      why: MID_COLORS_WHY,
    }),
    rule({
      id: `${prefix}-colors-very-clear`,
      family,
      when: veryClear,
      set: { colors: clearest },
      why: VERY_CLEAR_COLORS_WHY,
    }),
  ]
}

/**
 * After a cold front (common practice): a family fished slower and tight to cover (`near`), or
 * along the bottom on points and breaks where there is no cover (`open`); `fit` where it then
 * suits the day better.
 */
function afterColdFront(
  family: LureFamily,
  prefix: string,
  how: { near: string; open?: string; fit?: number },
): TackleRule[] {
  const rows = [
    rule({
      id: `${prefix}-cold-front`,
      family,
      when: coldFront,
      ...(how.fit !== undefined && { fit: how.fit }),
      set: { retrieve: how.near },
      why: COLD_FRONT_WHY,
    }),
  ]
  if (how.open)
    rows.push(
      rule({
        id: `${prefix}-cold-front-open`,
        family,
        when: (x) => coldFront(x) && openOnly(x),
        set: { retrieve: how.open },
        why: COLD_FRONT_OPEN_WHY,
      }),
    )
  return rows
}

export const TACKLE_RULES: TackleRule[] = [
  // Spinnerbait (blade bait)
  {
    id: 'blade-wind',
    family: 'spinnerbait',
    when: breezy,
    fit: 2,
    why: 'Some wind that breaks the surface helps a blade bait.',
    source: 'common practice',
  },
  {
    id: 'blade-stained',
    family: 'spinnerbait',
    when: dirty,
    fit: 1.5,
    why: 'In stained water the blade’s thump and flash help fish find it.',
    source: 'common practice',
  },
  {
    id: 'blade-wood',
    family: 'spinnerbait',
    when: (x) => has(x, 'wood'),
    fit: 1,
    why: 'Blade baits come through laydowns with fewer snags than bladed jigs.',
    source: 'common practice',
  },
  {
    id: 'blade-windblown-prime',
    family: 'spinnerbait',
    when: primeBladeBank,
    fit: 1,
    why: 'Windblown banks and points with rock and sparse grass are prime blade-bait water.',
    source: 'common practice',
  },
  {
    id: 'blade-dense-grass',
    family: 'spinnerbait',
    when: (x) => has(x, 'dense-grass'),
    fit: -1.5,
    why: 'Blade baits foul in dense grass; they are best over sparse grass and rock.',
    source: 'common practice',
  },
  {
    id: 'blade-open',
    family: 'spinnerbait',
    when: openOnly,
    set: { retrieve: 'erratic: twitches and pauses; let it fall along points and breaks' },
    why: 'No cover here: work it erratically along points and breaks.',
    source: 'common practice',
  },
  {
    id: 'blade-early-prespawn-sun',
    family: 'spinnerbait',
    when: (x) =>
      x.phase === 'early-pre-spawn' &&
      x.waterC >= 6 &&
      x.waterC <= 9.5 &&
      dirty(x) &&
      !breezy(x) &&
      x.sky === 'sun',
    fit: 2.5,
    set: { retrieve: 'slow-roll it close to wood and grass in the sun' },
    why: 'Early pre-spawn, mid-40s °F, stained, calm and sunny: fish sun near wood and grass, so slow-roll near cover.',
    source: 'common practice',
  },
  {
    id: 'blade-colorado-stained',
    family: 'spinnerbait',
    when: dirty,
    set: {
      blade: 'colorado',
      bladeFinish: 'gold; painted blades as a second option',
      size: 'single Colorado, size 6-7',
      colors: ['white', 'chartreuse'],
    },
    why: 'About 2 ft of visibility or less: a large single Colorado blade thumps more; white/chartreuse skirts show up.',
    source: 'common practice',
  },
  {
    id: 'blade-willow-default',
    family: 'spinnerbait',
    when: midClarity,
    set: { blade: 'double-willow', bladeFinish: 'gold and silver', colors: ['white', 'shad'] },
    why: 'A gold-and-silver willow combination serves most clarities; willow blades flash more.',
    source: 'common practice',
  },
  {
    id: 'blade-very-clear',
    family: 'spinnerbait',
    when: veryClear,
    set: {
      blade: 'double-willow',
      bladeFinish: 'larger blade silver, smaller gold',
      colors: ['translucent shad'],
    },
    why: 'Very clear water: translucent shad-like skirts; for more flash make the larger blade silver and the smaller gold.',
    source: 'common practice',
  },
  {
    id: 'blade-no-trailer',
    family: 'spinnerbait',
    when: () => true,
    set: { trailer: undefined },
    why: 'Trailers are mostly left off (about 95 % of the time).',
    source: 'common practice',
  },
  {
    id: 'blade-swimbait-trailer',
    family: 'spinnerbait',
    when: (x) => coldEarlySpring(x) && dirty(x),
    set: { trailer: 'large swimbait' },
    why: 'Cold, dirty early spring: a large swimbait trailer adds bulk and lift so the bait can be fished slower.',
    source: 'common practice',
  },
  {
    id: 'blade-split-tail-trailer',
    family: 'spinnerbait',
    when: (x) =>
      coldEarlySpring(x) &&
      !dirty(x) &&
      !breezy(x) &&
      has(x, 'wood', 'sparse-grass') &&
      (x.depthM ?? 1.5) <= 2,
    set: { trailer: 'slender split-tail' },
    why: 'Cold early spring, calm, over shallow cover: a slender split-tail trailer adds lift without bulk, to fish slower over the cover.',
    source: 'common practice',
  },
  {
    id: 'blade-trailer-hook-open',
    family: 'spinnerbait',
    when: (x) => !has(x, 'wood', 'sparse-grass', 'dense-grass') && has(x, 'rock', 'open', 'docks'),
    set: { trailerHook: true },
    why: 'On rock or open water add a trailer hook (and after a few short strikes).',
    source: 'common practice',
  },
  {
    id: 'blade-trailer-hook-snag',
    family: 'spinnerbait',
    when: (x) => has(x, 'wood', 'sparse-grass', 'dense-grass'),
    set: { trailerHook: false },
    why: 'Trailer hooks snag in grass and wood: leave it off here.',
    source: 'common practice',
  },
  {
    id: 'blade-slow-roll-deep',
    family: 'spinnerbait',
    // Well past the prime 10 ft, and never the prime windblown bank: that one stays erratic.
    when: (x) => (x.depthM ?? 0) >= DEEP_SLOW_ROLL_M && x.waterC < 12 && !primeBladeBank(x),
    set: { retrieve: 'steady slow-roll, deep along the bottom' },
    why: 'The retrieve is steady only when slow-rolling deep along the bottom.',
    source: 'common practice',
  },
  ...afterColdFront('spinnerbait', 'blade', {
    near: 'slow-roll it tight to cover, letting it bump and fall beside it',
    open: 'slow-roll it along the bottom on points and breaks',
  }),

  // Squarebill crankbait
  {
    id: 'squarebill-shallow-cover',
    family: 'squarebill crankbait',
    when: (x) =>
      x.waterC >= 10 &&
      x.waterC <= 26 &&
      has(x, 'wood', 'rock', 'docks') &&
      (x.depthM ?? 1.5) <= 2.5,
    fit: 2,
    why: 'A squarebill deflects off shallow wood and rock in water from about 50 °F.',
    source: 'common practice',
  },
  {
    id: 'squarebill-stained',
    family: 'squarebill crankbait',
    when: dirty,
    fit: 0.5,
    set: { colors: ['chartreuse', 'black back'] },
    why: 'Bright chartreuse with a dark back shows in dirty water.',
    source: 'common practice',
  },
  ...clarityColours(
    'squarebill crankbait',
    'squarebill',
    ['shad', 'crawfish'],
    ['translucent shad', 'natural craw'],
  ),
  {
    id: 'squarebill-too-deep',
    family: 'squarebill crankbait',
    when: (x) => (x.depthM ?? 0) > SQUAREBILL_MAX_DEPTH_M,
    rulesOut: true,
    why: 'A squarebill runs 1-1.5 m deep: over deeper water it touches neither bottom nor cover.',
    source: 'common practice',
  },
  {
    id: 'squarebill-too-cold',
    family: 'squarebill crankbait',
    when: (x) => x.waterC < SQUAREBILL_MIN_WATER_C,
    rulesOut: true,
    why: 'In water colder than the mid 40s °F fish will not chase a fast, deflecting crankbait.',
    source: 'common practice',
  },
  {
    id: 'squarebill-no-cover',
    family: 'squarebill crankbait',
    when: (x) => !has(x, 'wood', 'rock', 'docks'),
    rulesOut: true,
    why: 'A squarebill needs wood, rock or docks to deflect off.',
    source: 'common practice',
  },
  ...afterColdFront('squarebill crankbait', 'squarebill', {
    near: 'slow: crawl it into cover and pause longer after each contact',
  }),

  // Lipless crankbait
  {
    id: 'lipless-grass-cool',
    family: 'lipless crankbait',
    when: (x) =>
      has(x, 'sparse-grass') &&
      x.waterC >= 7 &&
      x.waterC <= 18 &&
      inPhase(x, 'early-pre-spawn', 'pre-spawn', 'fall'),
    fit: 2,
    why: 'Cool water over sparse grass in pre-spawn or fall: rip a lipless bait free of the grass.',
    source: 'common practice',
  },
  {
    id: 'lipless-open-search',
    family: 'lipless crankbait',
    when: (x) => openOnly(x) && x.waterC >= 7 && x.waterC <= 24,
    fit: 1,
    set: { retrieve: 'yo-yo it over flats and points: lift it off the bottom and let it fall' },
    why: 'With no cover to work, a lipless crankbait covers open flats and points fast to find roaming fish.',
    source: 'common practice',
  },
  {
    id: 'lipless-stained',
    family: 'lipless crankbait',
    when: dirty,
    set: { colors: ['red crawfish', 'chartreuse'] },
    why: 'Red and crawfish tones are a stained-water standby in spring; chartreuse shows in dirty water.',
    source: 'common practice',
  },
  ...clarityColours(
    'lipless crankbait',
    'lipless',
    ['chrome shad', 'gold'],
    ['translucent shad', 'natural shad'],
  ),
  ...afterColdFront('lipless crankbait', 'lipless', {
    near: 'slow: lift it and let it fall on a slack line by the grass edge',
    open: 'slow: lift it and let it fall along the bottom on flats and breaks',
  }),

  // Jerkbait
  {
    id: 'jerkbait-cold-clear',
    family: 'jerkbait',
    when: (x) => clearish(x) && x.waterC >= 4 && x.waterC <= 13,
    fit: 2.5,
    why: 'Cold, clear water: a suspending jerkbait hangs in front of slow fish.',
    source: 'common practice',
  },
  {
    id: 'jerkbait-wind',
    family: 'jerkbait',
    when: (x) => clearish(x) && breezy(x) && x.waterC <= 13,
    fit: 0.5,
    why: 'A ripple on clear water hides the line and the bait.',
    source: 'common practice',
  },
  {
    id: 'jerkbait-stained',
    family: 'jerkbait',
    when: dirty,
    set: { colors: ['chartreuse shad', 'black back'] },
    why: DIRTY_COLORS_WHY,
    source: 'common practice',
  },
  ...clarityColours(
    'jerkbait',
    'jerkbait',
    ['chrome shad', 'pearl'],
    ['ghost shad', 'translucent minnow'],
  ),
  ...afterColdFront('jerkbait', 'jerkbait', {
    near: 'slow: one twitch, then pause ten seconds and more, close to cover',
    open: 'slow: one twitch, then pause ten seconds and more over points and breaks',
  }),

  // Jig
  {
    id: 'jig-cover',
    family: 'jig',
    when: (x) => has(x, 'wood', 'rock', 'docks'),
    fit: 1.5,
    why: 'A jig pitched to wood, rock or docks reaches fish tight to cover.',
    source: 'common practice',
  },
  {
    id: 'jig-cold-or-hot',
    family: 'jig',
    when: (x) => inPhase(x, 'winter', 'summer'),
    fit: 1,
    why: 'In winter and summer fish hold deep and slow: a jig stays in front of them.',
    source: 'common practice',
  },
  {
    id: 'jig-open',
    family: 'jig',
    when: openOnly,
    set: { retrieve: 'drag and hop it along the bottom on points and breaks' },
    why: 'No cover to pitch to here: drag the jig along the bottom on points and breaks.',
    source: 'common practice',
  },
  {
    id: 'jig-stained',
    family: 'jig',
    when: dirty,
    set: { colors: ['black', 'blue'] },
    why: 'Black and blue make the strongest silhouette in dirty water.',
    source: 'common practice',
  },
  ...clarityColours('jig', 'jig', ['green pumpkin', 'brown'], ['watermelon', 'natural brown']),
  ...afterColdFront('jig', 'jig', {
    near: 'slow: pitch it tight to cover, let it sit, then small hops',
    open: 'slow: drag it along the bottom on points and breaks and let it sit',
    fit: 1.5,
  }),

  // Soft-plastic worm
  {
    id: 'worm-warm',
    family: 'soft-plastic worm',
    when: (x) => inPhase(x, 'spawn', 'post-spawn', 'summer'),
    fit: 2,
    why: 'Spawn through summer, a slow worm works beds, post-spawn banks and deep edges.',
    source: 'common practice',
  },
  {
    id: 'worm-dense-grass',
    family: 'soft-plastic worm',
    when: (x) => has(x, 'dense-grass'),
    fit: 1,
    why: 'Texas-rigged, it comes through dense grass without hanging.',
    source: 'common practice',
  },
  {
    id: 'worm-open',
    family: 'soft-plastic worm',
    when: openOnly,
    set: { retrieve: 'slow drag and lift along the bottom on points and breaks' },
    why: 'No cover here: drag it along the bottom on points and breaks.',
    source: 'common practice',
  },
  {
    id: 'worm-stained',
    family: 'soft-plastic worm',
    when: dirty,
    set: { colors: ['junebug', 'black'] },
    why: 'Dark colours show best in dirty water.',
    source: 'common practice',
  },
  ...clarityColours(
    'soft-plastic worm',
    'worm',
    ['green pumpkin', 'watermelon red'],
    ['watermelon', 'translucent green'],
  ),
  ...afterColdFront('soft-plastic worm', 'worm', {
    near: 'dead slow: let it sit tight to cover between small lifts',
    open: 'dead slow: drag it along the bottom on points and breaks and let it sit',
    fit: 1.5,
  }),

  // Topwater
  {
    id: 'topwater-warm-calm',
    family: 'topwater',
    when: (x) => x.waterC >= 16 && x.windMs < 4 && inPhase(x, 'post-spawn', 'summer', 'fall'),
    fit: 2,
    why: 'Warm water and a slick or light ripple: fish look up for a topwater.',
    source: 'common practice',
  },
  {
    id: 'topwater-low-light',
    family: 'topwater',
    when: (x) => x.waterC >= 16 && x.sky !== 'sun',
    fit: 0.5,
    why: 'Clouds and low light keep fish willing to come up.',
    source: 'common practice',
  },
  {
    id: 'topwater-open',
    family: 'topwater',
    when: openOnly,
    set: { retrieve: 'walk it with pauses over points and flats' },
    why: 'No cover here: walk it over points and flats where baitfish roam.',
    source: 'common practice',
  },
  {
    id: 'topwater-stained',
    family: 'topwater',
    when: dirty,
    set: { colors: ['black'] },
    why: 'A dark topwater silhouettes against the sky in dirty water.',
    source: 'common practice',
  },
  ...clarityColours('topwater', 'topwater', ['bone', 'shad'], ['clear', 'translucent shad']),
  {
    id: 'topwater-cold-front',
    family: 'topwater',
    when: coldFront,
    rulesOut: true,
    why: 'A cold front just passed: fish tuck tight to cover and will not come up; leave the topwater.',
    source: 'common practice',
  },

  // Swimbait
  {
    id: 'swimbait-clear-wind',
    family: 'swimbait',
    when: (x) => clearish(x) && breezy(x) && x.waterC >= 10,
    fit: 1.5,
    why: 'Clear water with some wind: a natural swimbait looks like the baitfish the wind pushes.',
    source: 'common practice',
  },
  {
    id: 'swimbait-transition',
    family: 'swimbait',
    when: (x) => clearish(x) && inPhase(x, 'pre-spawn', 'post-spawn', 'fall'),
    fit: 0.5,
    why: 'Fish chase baitfish in the transitions of spring and fall.',
    source: 'common practice',
  },
  {
    id: 'swimbait-open',
    family: 'swimbait',
    when: openOnly,
    set: { retrieve: 'steady and slow along breaks and over points' },
    why: 'No cover here: swim it along breaks and over points.',
    source: 'common practice',
  },
  {
    id: 'swimbait-stained',
    family: 'swimbait',
    when: dirty,
    set: { colors: ['white', 'chartreuse shad'] },
    why: DIRTY_COLORS_WHY,
    source: 'common practice',
  },
  ...clarityColours(
    'swimbait',
    'swimbait',
    ['natural shad', 'pearl'],
    ['translucent shad', 'ghost'],
  ),
  ...afterColdFront('swimbait', 'swimbait', {
    near: 'slow: crawl it tight past cover, near the bottom',
    open: 'slow: crawl it near the bottom along breaks and points',
  }),

  // Bladed jig
  {
    id: 'bladed-jig-grass',
    family: 'bladed jig',
    when: (x) =>
      has(x, 'sparse-grass') && (dirty(x) || x.clarity === 'lightly-stained') && x.waterC >= 10,
    fit: 2,
    why: 'Over sparse grass in stained water a bladed jig vibrates hard and comes free of the grass.',
    source: 'common practice',
  },
  {
    id: 'bladed-jig-wood',
    family: 'bladed jig',
    when: (x) => has(x, 'wood'),
    fit: -1,
    why: 'It snags in laydowns more than a spinnerbait does.',
    source: 'common practice',
  },
  {
    id: 'bladed-jig-dense-grass',
    family: 'bladed jig',
    when: (x) => has(x, 'dense-grass'),
    fit: -1.5,
    why: 'Blade baits foul in dense grass; they are best over sparse grass and rock.',
    source: 'common practice',
  },
  {
    id: 'bladed-jig-stained',
    family: 'bladed jig',
    when: dirty,
    set: { colors: ['white', 'chartreuse', 'black and blue'] },
    why: DIRTY_COLORS_WHY,
    source: 'common practice',
  },
  ...clarityColours(
    'bladed jig',
    'bladed-jig',
    ['white', 'shad'],
    ['translucent shad', 'natural shad'],
  ),
  ...afterColdFront('bladed jig', 'bladed-jig', {
    near: 'slow: crawl it along the grass tops and pause at the edges',
  }),
]
