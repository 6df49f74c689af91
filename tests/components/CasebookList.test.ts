// One of the casebook's own lists: its heading names the section and the table, the
// button says whether the form is open, an empty list says so, and every entry ends
// with Preview and Archive (Restore once archived), which the page acts on.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { h } from 'vue'
import CasebookList from '~/components/casebook/CasebookList.vue'

// the component's own constraint; these entries also carry a title for their cells
type Entry = { id: number, archived: boolean }
type Row = Entry & { title: string }
const base = {
  headingId: 'cases-heading',
  title: 'Your exact cases',
  newLabel: 'New exact case',
  empty: 'None yet.',
  columns: ['Title', 'Tolerance'],
  preview: (r: Entry) => ({ path: '/casebook/preview', query: { type: 'case', id: r.id } }),
}
const cells = ({ row }: { row: Entry }) => [h('td', (row as Row).title), h('td', '2°')]

describe('CasebookList', () => {
  it('says so when empty, and shows the form only when open', async () => {
    const closed = await mountSuspended(CasebookList, { props: { ...base, open: false, rows: [] }, slots: { form: () => h('form', { id: 'the-form' }) } })
    const section = closed.find('section')
    expect(section.attributes('aria-labelledby')).toBe('cases-heading')
    expect(closed.find('#cases-heading').text()).toBe('Your exact cases')
    expect(closed.find('button').attributes('aria-expanded')).toBe('false')
    expect(closed.find('#the-form').exists()).toBe(false)
    expect(closed.text()).toContain('None yet.')
    expect(closed.find('table').exists()).toBe(false)
    await closed.find('button').trigger('click')
    expect(closed.emitted('toggle')).toHaveLength(1)

    const open = await mountSuspended(CasebookList, { props: { ...base, open: true, rows: [] }, slots: { form: () => h('form', { id: 'the-form' }) } })
    expect(open.find('button').attributes('aria-expanded')).toBe('true')
    expect(open.find('#the-form').exists()).toBe(true)
  })

  it('lists the entries with their own cells, a preview link and archive or restore', async () => {
    const rows: Row[] = [{ id: 4, archived: false, title: 'Left IV palsy' }, { id: 9, archived: true, title: 'Old case' }]
    const wrapper = await mountSuspended(CasebookList, { props: { ...base, open: false, rows }, slots: { default: cells } })
    expect(wrapper.find('caption').text()).toBe('Your exact cases')
    expect(wrapper.findAll('thead th').map(th => th.text())).toEqual(['Title', 'Tolerance', 'Actions'])
    const trs = wrapper.findAll('tbody tr')
    expect(trs).toHaveLength(2)
    expect(trs[0]!.findAll('td').map(td => td.text())).toEqual(['Left IV palsy', '2°', 'PreviewArchive'])
    expect(trs[0]!.classes()).not.toContain('opacity-60')
    expect(trs[1]!.classes()).toContain('opacity-60')
    expect(trs[0]!.find('a').attributes('href')).toBe('/casebook/preview?type=case&id=4')
    expect(trs[1]!.find('button').text()).toBe('Restore')
    await trs[1]!.find('button').trigger('click')
    expect(wrapper.emitted('archive')).toEqual([[rows[1]]])
  })
})
