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

/** Exposure classes: still water, moving air, a worked bank, a bank too rough to fish. */
export const exposureColors: Record<ExposureClass, string> = {
  lee: '#5b8a8c',
  'side wind': '#c9a227',
  windward: '#d9731a',
  rough: '#a3271f',
}

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
