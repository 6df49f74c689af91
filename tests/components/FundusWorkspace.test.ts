// The one fundus measuring screen (drawn-fundus page, fundus quiz items, photographs):
// tabs and panel tied together, the marks and finding written into the page's state,
// the picture's own points only when given, and the page's own buttons in their place.
import { describe, expect, it } from 'vitest'
import { defineComponent, h, reactive, ref } from 'vue'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import FundusWorkspace from '~/components/fundus/FundusWorkspace.vue'
import type { FundusPicture } from '#shared/engine/fundus/picture'
import { FUNDUS_FINDINGS } from '#shared/engine/fundus/normals'
import type { Eye } from '#shared/engine/types'

const picture = (eye: Eye): FundusPicture => ({
  eye,
  frame: { width: 8, height: 6 },
  field: { x: 4, y: 3, radius: 3.6 },
  disc: { x: eye === 'RE' ? 5.3 : 2.7, y: 2.7, width: 0.96, height: 1.08 },
  fovea: { x: eye === 'RE' ? 2.7 : 5.3, y: 3.0 },
  lookKey: `f-test-${eye}`,
})

/** Both eyes on tabs, the way the drawn-fundus page and a two-eye quiz item use it. */
async function mountBothEyes(extra: Record<string, unknown> = {}) {
  const states = reactive<Record<Eye, FundusEyeState>>({ RE: emptyFundusEye(), LE: emptyFundusEye() })
  const eye = ref<Eye>('RE')
  const Host = defineComponent({
    setup() {
      return () => h(FundusWorkspace, {
        'eyes': ['RE', 'LE'],
        'eye': eye.value,
        'onUpdate:eye': (e: Eye) => (eye.value = e),
        'state': states[eye.value],
        'done': (e: Eye) => fundusEyeComplete(states[e]),
        'idPrefix': 'ws',
        'findingName': `ws-finding-${eye.value}`,
        'source': { kind: 'picture', picture: picture(eye.value) },
        'label': `Test fundus, ${EYE_LABELS[eye.value]}`,
        ...extra,
      })
    },
  })
  const wrapper = await mountSuspended(Host)
  return { wrapper, states, eye }
}

describe('FundusWorkspace', () => {
  it('ties the eye tabs to the panel, and switching tabs shows the other eye', async () => {
    const { wrapper, eye } = await mountBothEyes()
    const panel = wrapper.get('#ws-panel')
    expect(panel.attributes('role')).toBe('tabpanel')
    expect(panel.attributes('aria-labelledby')).toBe('ws-tab-RE')
    expect(wrapper.get('#ws-tab-RE').attributes('aria-controls')).toBe('ws-panel')
    await wrapper.get('#ws-tab-LE').trigger('click')
    expect(eye.value).toBe('LE')
    expect(wrapper.get('#ws-panel').attributes('aria-labelledby')).toBe('ws-tab-LE')
    expect(wrapper.get('canvas').attributes('aria-label')).toContain('Test fundus, left eye (LE)')
  })

  it('writes the finding into the shown eye\'s state and no other', async () => {
    const { wrapper, states } = await mountBothEyes()
    const radios = wrapper.findAll('input[type="radio"][name="ws-finding-RE"]')
    expect(radios).toHaveLength(FUNDUS_FINDINGS.length)
    await radios[1]!.setValue(true)
    expect(states.RE.finding).toBe(FUNDUS_FINDINGS[1])
    expect(states.LE.finding).toBeNull()
  })

  it('draws the picture\'s own points and says so only when they are given, and locks the tools when disabled', async () => {
    const plain = await mountBothEyes()
    expect(plain.wrapper.text()).not.toContain('Small green rings')
    const graded = await mountBothEyes({ reference: { disc: { x: 5.3, y: 2.7 }, fovea: { x: 2.7, y: 3 } }, disabled: true })
    expect(graded.wrapper.text()).toContain('Small green rings: the picture\'s own disc centre and fovea.')
    expect(graded.wrapper.get('fieldset').attributes('disabled')).toBeDefined()
  })

  it('with one eye has no tabs; without the finding it keeps the page\'s own buttons between the angle and how to measure', async () => {
    const state = reactive(emptyFundusEye())
    const wrapper = await mountSuspended(FundusWorkspace, {
      props: { eyes: ['LE'], eye: 'LE', state, source: { kind: 'picture', picture: picture('LE') }, label: 'One photograph', finding: false, photograph: true },
      slots: { actions: () => h('button', { 'type': 'button', 'data-testid': 'page-action' }, 'Save reference marks') },
    })
    expect(wrapper.find('[role="tablist"]').exists()).toBe(false)
    expect(wrapper.find('[role="tabpanel"]').exists()).toBe(false)
    expect(wrapper.find('input[type="radio"]').exists()).toBe(false)
    const text = wrapper.text()
    const action = text.indexOf('Save reference marks')
    expect(action).toBeGreaterThan(text.indexOf('Disc–fovea angle, left eye (LE)'))
    expect(action).toBeLessThan(text.indexOf('How to measure'))
    // a photograph: no light reflex promised at the fovea
    expect(text).not.toContain('with a small light reflex')
  })
})
