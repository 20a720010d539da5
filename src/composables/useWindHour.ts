import { computed, ref, type Ref } from 'vue'
import { bankExposure } from '@shared/conditions/exposure'
import type { BankView } from '@shared/schemas/banks'
import type { LakeRead } from '@shared/schemas/lake-read'
import { useFormat } from '@/composables/useSettings'

/**
 * The wind banks are coloured for: now, or a chosen hour of the next 12 (`hourAt`, from the
 * options in the user's clock and units), and each bank's exposure to it.
 */
export function useWindHour(read: Ref<LakeRead>) {
  const f = useFormat()
  const hours = computed(() =>
    [read.value.windNow, ...read.value.windNext12h].filter((h) => h !== null),
  )
  const hourAt = ref<string | null>(null)
  const wind = computed(
    () => hours.value.find((h) => h.at === hourAt.value) ?? hours.value[0] ?? null,
  )
  const hourOptions = computed(() =>
    hours.value.map((h, i) => ({
      label: `${i === 0 && read.value.windNow ? 'Now' : f.value.time(h.at, read.value.lake.timeZone)} · ${f.value.speed(h.windMs)} ${f.value.from(h.windFromDeg)}`,
      value: h.at,
    })),
  )
  const exposureOf = (b: BankView) =>
    wind.value ? bankExposure(b.exposure, wind.value.windFromDeg, wind.value.windMs) : null
  return { hourAt, hourOptions, wind, exposureOf }
}
