import type { Cover } from '@shared/conditions/tackle-rules'

export const COVER_LABELS: Record<Cover, string> = {
  wood: 'Wood / laydowns',
  'sparse-grass': 'Sparse grass',
  'dense-grass': 'Dense grass',
  rock: 'Rock',
  docks: 'Docks',
  open: 'Open bank',
}
