import { describe, expect, it } from 'vitest'
import { h } from 'vue'
import { NForm } from 'naive-ui'
import UnitFields from '@/components/settings/UnitFields.vue'
import { useFieldErrors } from '@/composables/useFieldErrors'
import { IMPERIAL, mountAs } from '../mountAs'

describe('UnitFields', () => {
  it('says the length choice also sets rain and pressure units', () => {
    const Form = {
      setup: () => {
        const errors = useFieldErrors()
        const units = { ...IMPERIAL }
        return () => h(NForm, null, () => h(UnitFields, { modelValue: units, errors }))
      },
    }
    const text = mountAs(IMPERIAL, Form).text()
    expect(text).toContain('Depth, rain and pressure')
    expect(text).toContain('feet (in, inHg)')
    expect(text).toContain('metres (mm, hPa)')
  })
})
