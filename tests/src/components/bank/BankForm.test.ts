import { describe, expect, it } from 'vitest'
import BankForm from '@/components/bank/BankForm.vue'
import { IMPERIAL, mountAs } from '../mountAs'

describe('BankForm', () => {
  it('hints at what each field wants instead of the component library’s “Please Input”', () => {
    const wrapper = mountAs(IMPERIAL, BankForm, { props: { submit: async () => undefined } })
    const html = wrapper.html()
    expect(html).not.toMatch(/Please (Input|Select)/)
    expect(html).toContain('e.g. Rocky point by the ramp')
    expect(html).toContain('How fast it drops off')
    expect(wrapper.text()).toContain('Depth a cast off the bank (ft)')
  })
})
