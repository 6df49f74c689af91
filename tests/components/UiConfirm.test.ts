// The one confirmation dialog: labelled by its heading, focus on the safe choice when
// it opens, Tab kept inside, Escape cancels, focus back on the opener when it closes.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { defineComponent, h, nextTick, ref } from 'vue'
import UiConfirm from '~/components/ui/UiConfirm.vue'

// a page with a button that opens the dialog, as the real pages do
const Host = defineComponent({
  setup() {
    const open = ref(false)
    const log = ref<string[]>([])
    return () => h('div', [
      h('button', { id: 'opener', onClick: () => (open.value = true) }, 'Release results'),
      h('button', { id: 'elsewhere' }, 'Elsewhere'),
      h(UiConfirm, {
        open: open.value,
        title: 'Release the results?',
        confirmLabel: 'Release and e-mail',
        onConfirm: () => {
          log.value.push('confirm')
          open.value = false
        },
        onCancel: () => {
          log.value.push('cancel')
          open.value = false
        },
      }, () => h('p', '12 students will be e-mailed.')),
      h('output', { id: 'log' }, log.value.join(',')),
    ])
  },
})

async function settle() {
  await nextTick()
  await nextTick()
  await new Promise(r => setTimeout(r, 0))
}

async function openHost() {
  const wrapper = await mountSuspended(Host, { attachTo: document.body })
  const opener = wrapper.find('#opener')
  ;(opener.element as HTMLButtonElement).focus()
  await opener.trigger('click')
  await settle()
  return wrapper
}

describe('UiConfirm', () => {
  it('is a modal dialog named by its heading and described by its text', async () => {
    const wrapper = await openHost()
    const dialog = wrapper.find('dialog')
    expect(dialog.attributes('role')).toBe('dialog')
    expect(dialog.attributes('aria-modal')).toBe('true')
    expect((dialog.element as HTMLDialogElement).open).toBe(true)
    const heading = wrapper.find(`#${dialog.attributes('aria-labelledby')}`)
    expect(heading.element.tagName).toBe('H2')
    expect(heading.text()).toBe('Release the results?')
    expect(wrapper.find(`#${dialog.attributes('aria-describedby')}`).text()).toBe('12 students will be e-mailed.')
    wrapper.unmount()
  })

  it('moves focus to the safe choice, keeps Tab inside and returns focus on Escape', async () => {
    const wrapper = await openHost()
    const dialog = wrapper.find('dialog')
    const [cancel, confirm] = dialog.findAll('button')
    expect(cancel!.text()).toBe('Cancel')
    expect(document.activeElement).toBe(cancel!.element)
    // Shift+Tab from the first control goes to the last; Tab from the last to the first
    await dialog.trigger('keydown', { key: 'Tab', shiftKey: true })
    expect(document.activeElement).toBe(confirm!.element)
    await dialog.trigger('keydown', { key: 'Tab' })
    expect(document.activeElement).toBe(cancel!.element)
    await dialog.trigger('keydown', { key: 'Escape' })
    await settle()
    expect(wrapper.find('#log').text()).toBe('cancel')
    expect((dialog.element as HTMLDialogElement).open).toBe(false)
    expect(document.activeElement).toBe(wrapper.find('#opener').element)
    wrapper.unmount()
  })

  it('confirms only on the confirm button', async () => {
    const wrapper = await openHost()
    const [, confirm] = wrapper.find('dialog').findAll('button')
    expect(confirm!.text()).toBe('Release and e-mail')
    expect(confirm!.classes()).toContain('btn-danger')
    await confirm!.trigger('click')
    await settle()
    expect(wrapper.find('#log').text()).toBe('confirm')
    expect(document.activeElement).toBe(wrapper.find('#opener').element)
    wrapper.unmount()
  })

  it('returns focus to the element it is given when nothing was focused as it opened', async () => {
    const target = document.createElement('select')
    document.body.appendChild(target)
    ;(document.activeElement as HTMLElement | null)?.blur?.()
    const wrapper = await mountSuspended(UiConfirm, { props: { open: false, title: 'Make Rafe a lecturer?', confirmLabel: 'Change the role', returnFocus: target }, attachTo: document.body })
    await wrapper.setProps({ open: true })
    await settle()
    expect(document.activeElement).toBe(wrapper.findAll('button')[0]!.element)
    await wrapper.setProps({ open: false })
    await settle()
    expect(document.activeElement).toBe(target)
    wrapper.unmount()
    target.remove()
  })

  it('cannot be cancelled or confirmed twice while busy', async () => {
    const wrapper = await mountSuspended(UiConfirm, { props: { open: true, title: 'Disable the account?', confirmLabel: 'Disable', busy: true, tone: 'primary' }, attachTo: document.body })
    await settle()
    const buttons = wrapper.findAll('button')
    expect(buttons.every(b => b.attributes('disabled') !== undefined)).toBe(true)
    expect(buttons[1]!.classes()).toContain('btn-primary')
    await wrapper.find('dialog').trigger('keydown', { key: 'Escape' })
    expect(wrapper.emitted('cancel')).toBeUndefined()
    wrapper.unmount()
  })
})
