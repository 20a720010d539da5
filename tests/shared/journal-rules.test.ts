import { describe, expect, it } from 'vitest'
import { LURE_FAMILIES, tackleLists } from '../../shared/conditions/tackle-lists'
import { haversineM, nearestBank } from '../../shared/geo/nearest'
import { PersonText } from '../../shared/schemas/text'

describe('the shared text rule', () => {
  const line = PersonText(20, 'the name')
  const note = PersonText(200, 'the note', { multiline: true })
  it.each(['rock\u0000point', 'bell\u0007', 'esc\u001b[2J', 'del\u007f', 'c1\u0085'])(
    'refuses %j',
    (text) => expect(line.safeParse(text).success).toBe(false),
  )
  it('keeps line breaks in notes only, and trims', () => {
    expect(note.parse('  two\nlines  ')).toBe('two\nlines')
    expect(line.safeParse('two\nlines').success).toBe(false)
    expect(line.parse('  Crème brûlée point ')).toBe('Crème brûlée point')
  })
})

describe('the tackle lists the journal offers', () => {
  it('name every family the tackle calls, with their own words', () => {
    expect(LURE_FAMILIES).toContain('spinnerbait')
    expect(LURE_FAMILIES).toContain('bladed jig')
    const spinner = tackleLists('spinnerbait')
    expect(spinner.colors).toContain('white')
    expect(spinner.sizes).toContain('single Colorado, size 6-7')
    expect(tackleLists('jig').trailers).toContain('craw')
  })
})

describe('the nearest bank', () => {
  // One minute of latitude is 1,852 m (the nautical mile, by definition) on a sphere of radius 6,366.7 km;
  // on the mean radius the minute is 1,853.2 m.
  it('measures a minute of latitude as about 1,853 m (haversine, mean Earth radius)', () => {
    expect(haversineM([0, 45], [0, 45 + 1 / 60])).toBeCloseTo(1853.2, 0)
  })
  it('picks the closest bank within 300 m, and none past it', () => {
    const banks = [
      { id: 'a', points: [[0, 0.001] as [number, number]] },
      { id: 'b', points: [[0, 0.002] as [number, number]] },
    ]
    expect(nearestBank([0, 0.0017], banks)?.id).toBe('b')
    expect(nearestBank([0, 0.01], banks)).toBeNull()
  })
})
