import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { waveGrowth } from '../../../shared/conditions/waves'
import { DomainError } from '../../../shared/errors'

describe('waveGrowth (USACE CEM EM 1110-2-1100 II-2-36..38)', () => {
  // Check values computed from the CEM formula (REFERENCES), tolerance 1 %.
  it.each([
    [10, 1000, 0.159, 1.03],
    [10, 5000, 0.355, 1.76],
  ])('%d m/s over %d m gives Hm0 %d m, Tp %d s (computed from CEM II-2-36)', (u, x, h, t) => {
    const w = waveGrowth(u, x)
    expect(Math.abs(w.heightM / h - 1)).toBeLessThan(0.01)
    expect(Math.abs(w.periodS / t - 1)).toBeLessThan(0.01)
    expect(w.limitedBy).toBe('fetch')
  })

  it('applies the duration limit: a short blow raises smaller waves (CEM II-2-38)', () => {
    const long = waveGrowth(15, 20_000)
    const short = waveGrowth(15, 20_000, 0.5)
    expect(short.heightM).toBeLessThan(long.heightM)
    expect(short.limitedBy).toBe('duration')
    expect(waveGrowth(15, 20_000, 48)).toEqual(long)
  })

  it('never grows past the fully developed cap (CEM II-2-37)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 40, noNaN: true }),
        fc.double({ min: 1, max: 5e6, noNaN: true }),
        (u, x) => {
          const cd = 0.001 * (1.1 + 0.035 * u)
          const { heightM } = waveGrowth(u, x)
          expect((9.80665 * heightM) / (cd * u * u)).toBeLessThanOrEqual(211.5 + 1e-9)
        },
      ),
    )
  })

  it('grows monotonically with wind and with fetch (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 30, noNaN: true }),
        fc.double({ min: 10, max: 100_000, noNaN: true }),
        fc.double({ min: 1.0001, max: 3, noNaN: true }),
        (u, x, k) => {
          const base = waveGrowth(u, x).heightM
          expect(waveGrowth(u * k, x).heightM).toBeGreaterThanOrEqual(base)
          expect(waveGrowth(u, x * k).heightM).toBeGreaterThanOrEqual(base)
        },
      ),
    )
  })

  it('is calm without wind or fetch and rejects bad input with a typed error', () => {
    expect(waveGrowth(0, 1000).heightM).toBe(0)
    expect(waveGrowth(10, 0).heightM).toBe(0)
    expect(() => waveGrowth(10, -5)).toThrow(DomainError)
    expect(() => waveGrowth(NaN, 100)).toThrow(/windSpeedMs/)
  })
})
