import { flushPromises } from '@vue/test-utils'
import { describe, expect, it, vi } from 'vitest'
import type { CsvImportReport } from '@shared/schemas/csv-import'
import CatchImport from '@/components/journal/CatchImport.vue'
import { IMPERIAL, mountAs } from '../mountAs'

const report: CsvImportReport = {
  rows: [
    { line: 2, values: { caught_at: '2026-05-04T11:00:00Z', lure: 'jig' }, errors: {} },
    {
      line: 3,
      values: { caught_at: 'yesterday', lure: '' },
      errors: { caught_at: 'Give a date and time.', lure: 'Say what it was caught on.' },
    },
  ],
  valid: 1,
  invalid: 1,
  imported: 0,
}
const importCsv = vi.fn(async () => report)
vi.mock('@/api/journal', () => ({ journalApi: { importCsv: () => importCsv() } }))

describe('importing catches from a CSV', () => {
  it('previews every row with its problems by column, and will not import a file with bad rows', async () => {
    const w = mountAs(IMPERIAL, CatchImport)
    const input = w.find('input[type="file"]')
    Object.defineProperty(input.element, 'files', {
      value: [new File(['caught_at\n'], 'journal.csv', { type: 'text/csv' })],
    })
    await input.trigger('change')
    await flushPromises()
    expect(importCsv).toHaveBeenCalledTimes(1)
    expect(w.text()).toContain('1 row ready, 1 needs attention.')
    const rows = w.findAll('tr').map((r) => r.text())
    expect(rows.find((r) => r.includes('yesterday'))).toContain(
      'caught_at: Give a date and time. · lure: Say what it was caught on.',
    )
    expect(rows.find((r) => r.includes('jig'))).toMatch(/—$/)
    const button = w.findAll('button').find((b) => b.text().startsWith('Import'))!
    expect(button.text()).toBe('Import 1 catch')
    expect(button.attributes('disabled')).toBeDefined()
  })
})
