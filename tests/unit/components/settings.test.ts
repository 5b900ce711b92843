// @vitest-environment nuxt
// The shop settings page in a Nuxt environment: it shows stored figures as they are (0.875 is
// 87.5 %), sends back only what the owner changed, and reads money as people type it.
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { readBody } from 'h3'
import { flushPromises } from '@vue/test-utils'
import { beforeEach, describe, expect, it } from 'vitest'
import Settings from '~/pages/settings.vue'

const STORED = {
  id: 1, name: 'Test shop', timeZone: 'America/Chicago', reportTime: '05:30', reportRecipients: null, dailyAllClear: false,
  lifeThreshold: 0.875, regrindLifeFraction: 0.8, orderCostCents: 2500, holdingRate: 0.25,
}
let sent: Array<Record<string, unknown>> = []
registerEndpoint('/api/shop', { method: 'GET', handler: () => STORED })
registerEndpoint('/api/shop', { method: 'PATCH', handler: async (event) => {
  sent.push(await readBody(event))
  return STORED
} })

beforeEach(() => {
  sent = []
})

const field = (wrapper: Awaited<ReturnType<typeof mountSuspended>>, name: string) => wrapper.find(`input[name="${name}"]`)

describe('shop settings', () => {
  it('shows a stored threshold to its tenth of a percent, not rounded', async () => {
    const page = await mountSuspended(Settings)
    expect((field(page, 'lifeThreshold').element as HTMLInputElement).value).toBe('87.5')
  })

  it('sends only the field that changed, so other figures keep their stored precision', async () => {
    const page = await mountSuspended(Settings)
    await field(page, 'reportTime').setValue('06:15')
    await page.find('form').trigger('submit')
    await flushPromises()
    expect(sent).toEqual([{ reportTime: '06:15' }])
  })

  it('reads money with the shared parser ($1,234.50) and a typed percentage as a fraction', async () => {
    const page = await mountSuspended(Settings)
    await field(page, 'orderCostCents').setValue('$1,234.50')
    await field(page, 'lifeThreshold').setValue('92.5')
    await page.find('form').trigger('submit')
    await flushPromises()
    expect(sent).toEqual([{ orderCostCents: 123450, lifeThreshold: 0.925 }])
  })
})
