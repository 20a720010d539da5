import { compassName } from '@shared/conditions/exposure'
import { cToF, mToFt, msToMph } from '@shared/units'

/** Display formats for the edges of the app: SI comes in, angler's units go out. */
export const fmt = {
  tempF: (c: number) => `${Math.round(cToF(c))} °F`,
  tempC: (c: number) => `${c.toFixed(1)} °C`,
  feet: (m: number) => `${mToFt(m).toFixed(1)} ft`,
  signedFeet: (m: number) => `${m >= 0 ? '+' : '−'}${Math.abs(mToFt(m)).toFixed(1)} ft`,
  mph: (ms: number) => `${Math.round(msToMph(ms))} mph`,
  from: (deg: number) => `from ${compassName(deg)}`,
  time: (iso: string | null, timeZone: string) =>
    iso
      ? new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', minute: '2-digit' }).format(
          new Date(iso),
        )
      : '—',
  /** "12 min ago", "3 h ago": how old a reading is. */
  age: (iso: string, now = Date.now()) => {
    const min = Math.max(0, Math.round((now - Date.parse(iso)) / 60_000))
    return min < 90
      ? `${min} min ago`
      : min < 2880
        ? `${Math.round(min / 60)} h ago`
        : `${Math.round(min / 1440)} days ago`
  },
}
