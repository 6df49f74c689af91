import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import UiPagination from '~/components/ui/UiPagination.vue'

describe('UiPagination', () => {
  it('shows the range and disables the ends', async () => {
    const first = await mountSuspended(UiPagination, { props: { page: 1, pageSize: 20, total: 45 } })
    expect(first.text()).toContain('1–20 of 45')
    expect(first.text()).toContain('Page 1 of 3')
    const [prev, next] = first.findAll('button')
    expect(prev!.attributes('disabled')).toBeDefined()
    expect(next!.attributes('disabled')).toBeUndefined()

    const last = await mountSuspended(UiPagination, { props: { page: 3, pageSize: 20, total: 45 } })
    expect(last.text()).toContain('41–45 of 45')
    expect(last.findAll('button')[1]!.attributes('disabled')).toBeDefined()
  })

  it('asks for the next page', async () => {
    const wrapper = await mountSuspended(UiPagination, { props: { page: 2, pageSize: 10, total: 45 } })
    await wrapper.findAll('button')[1]!.trigger('click')
    expect(wrapper.emitted('update:page')).toEqual([[3]])
  })

  it('copes with an empty list', async () => {
    const wrapper = await mountSuspended(UiPagination, { props: { page: 1, pageSize: 10, total: 0 } })
    expect(wrapper.text()).toContain('0–0 of 0')
    expect(wrapper.text()).toContain('Page 1 of 1')
  })
})
