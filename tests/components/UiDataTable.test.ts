// A data table: a caption read with it, one heading per column (a last one heard but
// not seen for a column of buttons), the rows from the slot, all inside a box that
// scrolls sideways on its own (WCAG 2.1 SC 1.4.10 Reflow allows it for data tables).
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { h } from 'vue'
import UiDataTable from '~/components/ui/UiDataTable.vue'

describe('UiDataTable', () => {
  it('names the table, heads every column and holds the rows', async () => {
    const wrapper = await mountSuspended(UiDataTable, {
      props: { caption: 'Your fundus photographs', columns: ['Title', 'Eye'], hiddenLast: 'Actions' },
      slots: { default: () => h('tr', { id: 'row' }, [h('td', 'Disc study'), h('td', 'RE'), h('td', h('button', 'Open'))]) },
    })
    expect(wrapper.classes()).toContain('overflow-x-auto')
    const caption = wrapper.find('caption')
    expect(caption.text()).toBe('Your fundus photographs')
    expect(caption.classes()).toContain('sr-only')
    const heads = wrapper.findAll('thead th')
    expect(heads.map(th => th.attributes('scope'))).toEqual(['col', 'col', 'col'])
    expect(heads.map(th => th.text())).toEqual(['Title', 'Eye', 'Actions'])
    expect(heads[2]!.find('span.sr-only').text()).toBe('Actions')
    expect(wrapper.find('tbody #row').findAll('td')).toHaveLength(3)
  })

  it('leaves out the caption and the hidden heading when not given', async () => {
    const wrapper = await mountSuspended(UiDataTable, { props: { columns: ['Eye', 'Your angle'] } })
    expect(wrapper.find('caption').exists()).toBe(false)
    expect(wrapper.findAll('thead th').map(th => th.text())).toEqual(['Eye', 'Your angle'])
    expect(wrapper.find('thead .sr-only').exists()).toBe(false)
  })
})
