import { NDatePicker, NTimePicker } from 'naive-ui'
import { describe, expect, it } from 'vitest'
import { defineComponent, h, withDirectives } from 'vue'
import { vInputAttrs } from '@/directives/inputAttrs'
import { IMPERIAL, mountAs } from '../mountAs'

describe('date and time pickers', () => {
  it('give their inputs a name, which naive-ui’s pickers take no input-props for', () => {
    const form = defineComponent({
      render: () => [
        withDirectives(h(NDatePicker, { type: 'date' }), [[vInputAttrs, { 'aria-label': 'Day' }]]),
        withDirectives(h(NTimePicker), [[vInputAttrs, { 'aria-label': 'Meeting time' }]]),
      ],
    })
    const inputs = mountAs(IMPERIAL, form).findAll('input')
    expect(inputs.map((i) => i.attributes('aria-label'))).toEqual(['Day', 'Meeting time'])
  })
})
