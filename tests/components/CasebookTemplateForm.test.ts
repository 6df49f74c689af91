// The case template form on the shared UiForm and UiField: every field named as
// before (the range fields "Torsion from" … "Vertical to"), the body it saves, and a
// refused range tied to both fields of its group with focus on the first
// (WCAG 2.1 SC 3.3.1, 2.4.3; WAI-ARIA 1.2 aria-invalid).
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { nextTick } from 'vue'
import CasebookTemplateForm from '~/components/casebook/CasebookTemplateForm.vue'
import type { EngineTemplateView } from '#shared/types/casebook'

// invented template views (the form shows only id, label and ranges)
const engine: EngineTemplateView[] = [
  { id: 'lso-std', label: 'Left SO palsy (standard)', condition: 'so-palsy', difficulty: 'standard', side: 'LE', sideFromSeed: false, torsion: { range: [4, 8], of: 'affected-eye' }, vertical: [5, 12], sources: ['invented for the test'] },
]

async function settle() {
  await nextTick()
  await nextTick()
  await new Promise(r => setTimeout(r, 0))
}
const labelOf = (w: Awaited<ReturnType<typeof mountSuspended>>, id: string) => w.find(`label[for="${id}"]`).element.textContent

describe('CasebookTemplateForm', () => {
  it('names every field as a label the browser ties to it', async () => {
    const wrapper = await mountSuspended(CasebookTemplateForm, { props: { engine } })
    expect(wrapper.find('form').attributes('aria-label')).toBe('New case template')
    expect(labelOf(wrapper, 'ct-base')).toBe('Based on')
    expect(labelOf(wrapper, 'ct-title')).toBe('Title')
    expect(labelOf(wrapper, 'ct-t-lo')).toBe('Torsion from')
    expect(labelOf(wrapper, 'ct-t-hi')).toBe('Torsion to')
    expect(labelOf(wrapper, 'ct-v-lo')).toBe('Vertical from')
    expect(labelOf(wrapper, 'ct-v-hi')).toBe('Vertical to')
    expect(labelOf(wrapper, 'ct-tolerance')).toBe('Tolerance (degrees)')
    expect(labelOf(wrapper, 'ct-notes')).toBe('Notes (for you)')
    expect(wrapper.findAll('legend').map(l => l.text())).toEqual(['Torsion (degrees)', 'Vertical deviation (Δ)'])
  })

  it('saves the ranges filled in and leaves out the blank ones', async () => {
    const wrapper = await mountSuspended(CasebookTemplateForm, { props: { engine } })
    await wrapper.find('#ct-base').setValue('lso-std')
    expect((wrapper.find('#ct-title').element as HTMLInputElement).value).toBe('Left SO palsy (standard)')
    expect(wrapper.text()).toContain('Published ranges: torsion 4–8°')
    await wrapper.find('#ct-t-lo').setValue('6')
    await wrapper.find('#ct-t-hi').setValue('8')
    await wrapper.find('form').trigger('submit')
    expect(wrapper.emitted('save')).toEqual([[{ title: 'Left SO palsy (standard)', templateId: 'lso-std', ranges: { torsion: [6, 8] }, tolerance: 2, notes: undefined }]])
  })

  it('ties a refused range to both of its fields and focuses the first', async () => {
    const wrapper = await mountSuspended(CasebookTemplateForm, { props: { engine }, attachTo: document.body })
    await wrapper.setProps({ problem: { message: 'Check the form.', fields: { 'ranges.torsion': 'Stay inside the published range for this template: 4–8°.' } } })
    await settle()
    const error = wrapper.find('.field-error')
    expect(error.text()).toBe('Stay inside the published range for this template: 4–8°.')
    for (const id of ['ct-t-lo', 'ct-t-hi']) {
      expect(wrapper.find(`#${id}`).attributes('aria-invalid'), id).toBe('true')
      expect(wrapper.find(`#${id}`).attributes('aria-describedby'), id).toBe(error.attributes('id'))
    }
    expect(wrapper.find('#ct-v-lo').attributes('aria-invalid')).toBeUndefined()
    expect(document.activeElement).toBe(wrapper.find('#ct-t-lo').element)
    wrapper.unmount()
  })
})
