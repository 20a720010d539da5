// Cover in words lives beside the cover keys in shared/, where the engine's reasons use it too.
export { COVER_LABELS } from '@shared/conditions/tackle-rules'

/** A bank's bottom slope in words. */
export const SLOPE_LABELS = {
  flat: 'Flat',
  gradual: 'Gradual',
  steep: 'Steep',
  'drop-off': 'Drop-off',
} as const
