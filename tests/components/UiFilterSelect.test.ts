// UiFilterSelect: a labelled filter whose empty value means "all", keeping the options' own types.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import UiFilterSelect from '~/components/ui/UiFilterSelect.vue'

const cohorts = [{ value: 3, label: 'Osprey cohort' }, { value: 7, label: 'Heron cohort' }]

describe('UiFilterSelect', () => {
  it('is a select named by its label, "all" first, then the options', async () => {
    const wrapper = await mountSuspended(UiFilterSelect, { props: { id: 'f-cohort', label: 'Cohort', all: 'All cohorts', options: cohorts, modelValue: '' } })
    const label = wrapper.get('label')
    expect(label.attributes('for')).toBe('f-cohort')
    expect(label.text()).toBe('Cohort')
    const select = wrapper.get('select')
    expect(select.attributes('id')).toBe('f-cohort')
    expect(wrapper.findAll('option').map(o => [o.element.value, o.text()])).toEqual([['', 'All cohorts'], ['3', 'Osprey cohort'], ['7', 'Heron cohort']])
    expect((select.element as HTMLSelectElement).value).toBe('')
  })

  it('shows the chosen value and hands back a number as a number, "all" as the empty value', async () => {
    const wrapper = await mountSuspended(UiFilterSelect, { props: { id: 'f', label: 'Cohort', all: 'All cohorts', options: cohorts, modelValue: 7 } })
    const select = wrapper.get('select')
    expect((select.element as HTMLSelectElement).value).toBe('7')
    await select.setValue('3')
    await select.setValue('')
    expect(wrapper.emitted('update:modelValue')).toEqual([[3], ['']])
  })
})
