// The row an empty table shows: one cell across all its columns.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import UiEmptyRow from '~/components/ui/UiEmptyRow.vue'

describe('UiEmptyRow', () => {
  it('spans every column with what it says', async () => {
    const wrapper = await mountSuspended(UiEmptyRow, { props: { columns: 7 }, slots: { default: () => 'No student matches these filters.' } })
    const cells = wrapper.findAll('td')
    expect(cells).toHaveLength(1)
    expect(cells[0]!.attributes('colspan')).toBe('7')
    expect(cells[0]!.text()).toBe('No student matches these filters.')
    expect(cells[0]!.classes()).toEqual(expect.arrayContaining(['text-center', 'text-ink-soft', 'py-6']))
  })

  it('takes less room in a report section when compact', async () => {
    const wrapper = await mountSuspended(UiEmptyRow, { props: { columns: 3, compact: true }, slots: { default: () => 'No attempts in this view.' } })
    const cell = wrapper.find('td')
    expect(cell.classes()).toContain('py-4')
    expect(cell.classes()).not.toContain('py-6')
  })
})
