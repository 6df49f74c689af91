// The shared form: a refusal that names no field shows as an alert; one that names
// fields puts each message after its field, tied to it, with focus on the first
// (WCAG 2.1 SC 3.3.1 Error Identification, 2.4.3 Focus Order; WAI-ARIA 1.2 aria-invalid).
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { defineComponent, h, nextTick, ref } from 'vue'
import UiField from '~/components/ui/UiField.vue'
import UiForm from '~/components/ui/UiForm.vue'

const problem = ref<ApiProblem | null>(null)
const sent = ref(0)
// a form with two fields, written as the real forms write them
const Host = defineComponent({
  setup() {
    return () => h(UiForm, { label: 'Quiz settings', problem: problem.value, onSubmit: () => sent.value++ }, {
      default: ({ err }: { err: (path: string) => string | undefined }) => [
        h(UiField, { control: 'f-title', label: 'Title', error: err('title'), errorId: 'f-title-error' },
          () => h('input', { 'id': 'f-title', 'aria-describedby': 'f-title-error' })),
        h(UiField, { control: 'f-limit', label: 'Time limit', error: err('limit') }, () => h('input', { id: 'f-limit' })),
        h('button', { type: 'submit' }, 'Save'),
      ],
    })
  },
})

async function settle() {
  await nextTick()
  await nextTick()
  await new Promise(r => setTimeout(r, 0))
}

describe('UiForm', () => {
  it('is a named form the browser does not validate, and hands a submit to its owner', async () => {
    problem.value = null
    sent.value = 0
    const wrapper = await mountSuspended(Host)
    const form = wrapper.find('form')
    expect(form.attributes('aria-label')).toBe('Quiz settings')
    expect(form.attributes('novalidate')).toBeDefined()
    expect(wrapper.find('[role="alert"]').exists()).toBe(false)
    await form.trigger('submit')
    expect(sent.value).toBe(1)
    wrapper.unmount()
  })

  it('shows a refusal that names no field as an alert and moves focus to it', async () => {
    problem.value = null
    const wrapper = await mountSuspended(Host, { attachTo: document.body })
    problem.value = { message: 'The quiz has closed.', fields: {} }
    await settle()
    const alert = wrapper.find('[role="alert"]')
    expect(alert.text()).toBe('The quiz has closed.')
    expect(document.activeElement).toBe(alert.element)
    expect(wrapper.find('.field-error').exists()).toBe(false)
    wrapper.unmount()
  })

  it('puts each field\'s message after it, tied to it, and focuses the first field in error', async () => {
    problem.value = null
    const wrapper = await mountSuspended(Host, { attachTo: document.body })
    problem.value = { message: 'Check the form.', fields: { limit: 'Between 1 and 600 minutes.' } }
    await settle()
    expect(wrapper.find('[role="alert"]').exists()).toBe(false)
    const limit = wrapper.find('#f-limit')
    const error = wrapper.find('.field-error')
    expect(error.text()).toBe('Between 1 and 600 minutes.')
    expect(limit.attributes('aria-invalid')).toBe('true')
    expect(limit.attributes('aria-describedby')).toBe(error.attributes('id'))
    expect(document.activeElement).toBe(limit.element)
    expect(wrapper.find('#f-title').attributes('aria-invalid')).toBeUndefined()

    // a later refusal naming both: focus goes to the first, the page's own id is kept
    problem.value = { message: 'Check the form.', fields: { title: 'A title is needed.', limit: 'Between 1 and 600 minutes.' } }
    await settle()
    const title = wrapper.find('#f-title')
    expect(wrapper.find('#f-title-error').text()).toBe('A title is needed.')
    expect(title.attributes('aria-describedby')).toBe('f-title-error')
    expect(title.attributes('aria-invalid')).toBe('true')
    expect(document.activeElement).toBe(title.element)
    wrapper.unmount()
  })
})
