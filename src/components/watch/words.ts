import { CLARITY_LABELS } from '@shared/conditions/clarity'
import { WINDOW_LABELS } from '@shared/conditions/day-plan'
import { PHASE_LABELS } from '@shared/conditions/season'
import { DEFAULT_SETTINGS, makeFormat } from '@shared/format'
import type { WatchConditions, WatchWind } from '@shared/schemas/watch'
import { wordList } from '@shared/words'

export const CHANNEL_LABELS = { email: 'E-mail', push: 'Push on my devices' } as const

/** The label of the unit a watch's wind was typed in ("mph", "km/h", "kt"), as the app writes it. */
export const speedUnitLabel = (unit: WatchWind['unit']) =>
  makeFormat({ ...DEFAULT_SETTINGS, speed: unit }).speedUnit

const either = (words: string[]) => wordList(words, 'or')

/** What a watch waits for, in words: "wind 8 to 20 mph onto the bank · stained water · …". */
export function conditionWords(c: WatchConditions): string[] {
  const parts: string[] = []
  if (c.wind)
    parts.push(
      `wind ${c.wind.min} to ${c.wind.max} ${speedUnitLabel(c.wind.unit)}${c.wind.onto ? ' onto the bank' : ''}`,
    )
  if (c.clarity.length) parts.push(`${either(c.clarity.map((x) => CLARITY_LABELS[x]))} water`)
  if (c.phases.length) parts.push(either(c.phases.map((x) => PHASE_LABELS[x])))
  if (c.windows.length) parts.push(either(c.windows.map((x) => WINDOW_LABELS[x].toLowerCase())))
  if (c.notNoGo) parts.push('not a no-go')
  parts.push(
    c.daysAhead == null
      ? 'any day forecast'
      : c.daysAhead === 1
        ? 'today only'
        : `the next ${c.daysAhead} days`,
  )
  return parts
}
