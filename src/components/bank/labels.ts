// Cover in words lives beside the cover keys in shared/, where the engine's reasons use it too.
export { COVER_LABELS } from '@shared/conditions/tackle-rules'
