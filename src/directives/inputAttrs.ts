import type { Directive } from 'vue'

/**
 * Attributes for the text input inside a naive-ui picker. NDatePicker and NTimePicker take no
 * `input-props`, so their input has no name of its own; `v-input-attrs="{ 'aria-label': 'Day' }"`
 * gives it one (or an `id` for a `<label for>`), set again whenever the picker re-renders.
 */
export const vInputAttrs: Directive<HTMLElement, Record<string, string>> = {
  mounted: apply,
  updated: apply,
}

function apply(el: HTMLElement, { value }: { value: Record<string, string> }) {
  const input = el.querySelector('input')
  if (!input) return
  for (const [name, v] of Object.entries(value)) input.setAttribute(name, v)
}
