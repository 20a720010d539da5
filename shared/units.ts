/** Exact conversion factors (NIST SP 811). SI inside shared/; these are for the edges. */
export const M_PER_FT = 0.3048
export const MM_PER_IN = 25.4
export const M_PER_MI = 1609.344
export const KM2_PER_SQ_MI = 2.589988
export const KG_PER_LB = 0.45359237
export const MS_PER_MPH = 0.44704
export const MS_PER_KNOT = 1852 / 3600
export const MS_PER_KMH = 1 / 3.6
/** Inch of mercury (32 °F) = 3386.38 Pa (NIST SP 811, appendix B.8). */
export const HPA_PER_INHG = 33.8638

export const cToF = (c: number) => (c * 9) / 5 + 32
export const fToC = (f: number) => ((f - 32) * 5) / 9
export const mToFt = (m: number) => m / M_PER_FT
export const ftToM = (ft: number) => ft * M_PER_FT
export const msToMph = (ms: number) => ms / MS_PER_MPH
export const msToKnots = (ms: number) => ms / MS_PER_KNOT
export const msToKmh = (ms: number) => ms / MS_PER_KMH
