// UiLoadState: the refusal first, then the loading line, then the empty slot, then the content.
import { describe, expect, it } from 'vitest'
import { h } from 'vue'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import UiLoadState from '~/components/ui/UiLoadState.vue'

// the shape useFetch gives a refused request: statusCode and the h3 error body in `data`
const refusal = { statusCode: 404, data: { message: 'No such quiz.' } }
const slots = { default: () => h('p', { id: 'content' }, 'The content'), empty: () => h('p', { id: 'empty' }, 'Nothing yet') }

describe('UiLoadState', () => {
  it('shows the server\'s message as an alert, and neither the loading line nor the content', async () => {
    const wrapper = await mountSuspended(UiLoadState, { props: { error: refusal, pending: true }, slots })
    const alert = wrapper.find('[role="alert"]')
    expect(alert.element.textContent).toBe('No such quiz.')
    expect(wrapper.find('button').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('Loading')
    expect(wrapper.find('#content').exists()).toBe(false)
  })

  it('offers "Try again" when the page gives a retry, and calls it', async () => {
    let tries = 0
    const wrapper = await mountSuspended(UiLoadState, { props: { error: refusal, retry: () => tries++ }, slots })
    const button = wrapper.get('[role="alert"] button')
    expect(button.text()).toBe('Try again')
    expect(wrapper.get('[role="alert"]').element.textContent).toBe('No such quiz. Try again')
    await button.trigger('click')
    expect(tries).toBe(1)
  })

  it('says the server could not be reached when the error has no status', async () => {
    const wrapper = await mountSuspended(UiLoadState, { props: { error: new TypeError('fetch failed') } })
    expect(wrapper.get('[role="alert"]').text()).toMatch(/could not be reached/)
  })

  it('shows the loading line while pending, in the page\'s words, with the page\'s class', async () => {
    const plain = await mountSuspended(UiLoadState, { props: { pending: true }, slots })
    expect(plain.get('p').text()).toBe('Loading…')
    expect(plain.find('#content').exists()).toBe(false)
    const worded = await mountSuspended(UiLoadState, { props: { pending: true, loading: 'Loading the quiz…' }, attrs: { class: 'text-sm' }, slots })
    const line = worded.get('p')
    expect(line.text()).toBe('Loading the quiz…')
    expect(line.classes()).toEqual(expect.arrayContaining(['text-ink-soft', 'text-sm']))
  })

  it('shows the empty slot when empty, else the content, and nothing of its own', async () => {
    const empty = await mountSuspended(UiLoadState, { props: { empty: true }, slots })
    expect(empty.find('#empty').exists()).toBe(true)
    expect(empty.find('#content').exists()).toBe(false)
    const full = await mountSuspended(UiLoadState, { props: { empty: false }, attrs: { class: 'mt-4' }, slots })
    expect(full.find('#content').exists()).toBe(true)
    expect(full.find('#empty').exists()).toBe(false)
    expect(full.find('[role="alert"]').exists()).toBe(false)
    // the page's attributes are for the alert and the loading line, not its content
    expect(full.get('#content').classes()).not.toContain('mt-4')
  })

  it('renders nothing when there is nothing to say and no content', async () => {
    const wrapper = await mountSuspended(UiLoadState, { props: { pending: false } })
    expect(wrapper.text()).toBe('')
  })
})
