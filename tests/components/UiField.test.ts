// One labelled field: the label names the control, the error follows the control
// (and its help), and what comes `after` follows the error.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { h } from 'vue'
import UiField from '~/components/ui/UiField.vue'

describe('UiField', () => {
  it('labels the control and shows no error when there is none', async () => {
    const wrapper = await mountSuspended(UiField, {
      props: { control: 'quiz-title', label: 'Title' },
      slots: { default: () => h('input', { id: 'quiz-title' }) },
    })
    const label = wrapper.find('label')
    expect(label.attributes('for')).toBe('quiz-title')
    expect(label.classes()).toContain('field-label')
    expect(label.text()).toBe('Title')
    expect(wrapper.find('#quiz-title').exists()).toBe(true)
    expect(wrapper.find('.field-error').exists()).toBe(false)
  })

  it('puts the error after the control and its help, under the id the control names', async () => {
    const wrapper = await mountSuspended(UiField, {
      props: { control: 'quiz-limit', label: 'Time limit (minutes)', error: 'Between 1 and 600.', errorId: 'quiz-limit-error' },
      slots: {
        default: () => [h('input', { 'id': 'quiz-limit', 'aria-describedby': 'quiz-limit-error' }), h('p', { id: 'quiz-limit-help' }, 'No limit when blank.')],
        after: () => h('p', { id: 'more' }, 'More about limits.'),
      },
    })
    const order = [...wrapper.element.children].map(e => e.id || e.tagName)
    expect(order).toEqual(['LABEL', 'quiz-limit', 'quiz-limit-help', 'quiz-limit-error', 'more'])
    const error = wrapper.find('#quiz-limit-error')
    expect(error.classes()).toContain('field-error')
    expect(error.text()).toBe('Between 1 and 600.')
  })

  it('leaves the error without an id when none is given (focusFirstError gives one)', async () => {
    const wrapper = await mountSuspended(UiField, {
      props: { control: 'ct-title', label: 'Title', error: 'A title is needed.' },
      slots: { default: () => h('input', { id: 'ct-title' }) },
    })
    expect(wrapper.find('.field-error').attributes('id')).toBeUndefined()
  })
})
