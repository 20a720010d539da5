import type { ClarityClass } from '@shared/conditions/clarity'
import type { ExposureClass } from '@shared/conditions/exposure'
import type { GlobalThemeOverrides } from 'naive-ui'

const font = "'Barlow', system-ui, -apple-system, 'Segoe UI', sans-serif"

/** Colours taken from water: tannin, olive, jade, lake blue, glacier. */
export const palette = {
  lake: '#1f5f7a',
  lakeHover: '#2a7896',
  lakePressed: '#174a5f',
  tannin: '#7a5230',
  olive: '#6f7334',
  jade: '#3f8f74',
  lakeBlue: '#2f7fa8',
  glacier: '#9fd3e0',
}

/** Clarity classes take their colours from the water they name. */
export const clarityColors: Record<ClarityClass, string> = {
  muddy: palette.tannin,
  stained: palette.olive,
  'lightly-stained': palette.jade,
  clear: palette.lakeBlue,
  'very-clear': palette.glacier,
}

/**
 * Exposure classes: still slate water, a gold ripple along the bank, jade for the worked bank
 * (windward is prime in a moderate wind, so it is no warning colour), red only for a bank too
 * rough to fish.
 */
export const exposureColors: Record<ExposureClass, string> = {
  lee: '#6f8791',
  'side wind': '#b8921f',
  windward: palette.jade,
  rough: '#a3271f',
}

/** Each class's dashes on the outline and in its legend, so the class never rests on colour alone. */
export const exposureDashes: Record<ExposureClass, string | undefined> = {
  lee: '2 3',
  'side wind': '6 3',
  windward: undefined,
  rough: '9 2 2 2',
}

/** What each exposure class means, for the legend beside the outline. */
export const EXPOSURE_MEANINGS: Record<ExposureClass, string> = {
  lee: 'sheltered: the wind blows off the bank',
  'side wind': 'the wind runs along the bank',
  windward: 'the wind blows onto the bank: prime in a moderate wind',
  rough: 'waves or gusts too strong for a small boat',
}

/** A station's daily bars on the desk: most readings stored, fewer, and a day with refusals. */
export const stationBarColors = { full: palette.lakeBlue, short: '#b07a1f', refused: '#a33a0b' }

export const themeOverrides: GlobalThemeOverrides = {
  common: {
    fontFamily: font,
    fontFamilyMono: "ui-monospace, 'SFMono-Regular', Menlo, monospace",
    fontSize: '15px',
    primaryColor: palette.lake,
    primaryColorHover: palette.lakeHover,
    primaryColorPressed: palette.lakePressed,
    primaryColorSuppl: palette.lakeHover,
    borderRadius: '6px',
  },
  // The default rail is too pale behind the switch's white "Follow" text (WCAG AA contrast).
  Switch: { railColor: '#5f6b73' },
}

export const darkThemeOverrides: GlobalThemeOverrides = {
  common: {
    ...themeOverrides.common,
    primaryColor: palette.glacier,
    primaryColorHover: '#b8e2eb',
    primaryColorPressed: '#7fbccc',
    primaryColorSuppl: '#b8e2eb',
  },
}
