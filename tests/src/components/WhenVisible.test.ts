import { mount } from '@vue/test-utils'
import { afterEach, expect, it, vi } from 'vitest'
import { h, nextTick } from 'vue'
import WhenVisible from '@/components/WhenVisible.vue'

/** An IntersectionObserver whose one instance the test tells when its element comes into view. */
function stubObserver() {
  const seen: { enter?: () => void } = {}
  vi.stubGlobal(
    'IntersectionObserver',
    class {
      constructor(callback: (entries: { isIntersecting: boolean }[]) => void) {
        seen.enter = () => callback([{ isIntersecting: true }])
      }
      observe() {}
      disconnect() {}
    },
  )
  return seen
}

afterEach(() => vi.unstubAllGlobals())

it('holds its room before and after its part arrives, so nothing below it moves', async () => {
  const observer = stubObserver()
  const wrapper = mount(WhenVisible, {
    props: { minHeight: '58rem' },
    slots: { default: () => h('p', 'The banks') },
  })
  expect(wrapper.text()).toBe('')
  expect(wrapper.attributes('style')).toContain('min-height: 58rem')
  observer.enter!()
  await nextTick()
  expect(wrapper.text()).toBe('The banks')
  expect(wrapper.attributes('style')).toContain('min-height: 58rem')
})
