// @vitest-environment nuxt
// The cutter page's feeds card in a Nuxt environment: it asks for a material and machine until
// it has them, then shows the figures, the warnings with their reasons and the cautions, and
// hands the suggested rpm and feed to the cut log.
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { flushPromises } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import FeedsCard from '~/components/spindle/FeedsCard.vue'
import { CAUTIONS } from '#shared/kerf/feeds'

registerEndpoint('/api/feeds', () => ({
  rpm: 17996, chipLoadMm: 0.1778, feedMmPerMin: 3199.7, feedInPerMin: 126, surfaceSpeedMPerMin: 359, plungeMmPerMin: 1065.5,
  depthPerPassMm: 3.18, rpmClamped: null, notes: [], cautions: CAUTIONS,
  warnings: [{ code: 'downcut_in_plastic', message: 'A downcut bit pushes chips down into the cut.' }],
  learned: { bad: { count: 2, rpm: 24000, feedMmPerMin: 1200, feedInPerMin: 47.2, chipLoadMm: 0.05 }, clean: { count: 5, rpm: 18000, feedMmPerMin: 3000, feedInPerMin: 118.1, chipLoadMm: 0.1667 } },
}))

describe('the feeds card', () => {
  it('asks for what it lacks instead of guessing', async () => {
    const card = await mountSuspended(FeedsCard, { props: { typeId: 1, materialId: null, machineId: 2 } })
    expect(card.text()).toContain('Choose the material to see')
  })

  it('shows the settings, the warning and its reason, the nudge and the cautions, and hands the settings on', async () => {
    const card = await mountSuspended(FeedsCard, { props: { typeId: 1, materialId: 3, machineId: 2, cutterId: 4 } })
    await flushPromises()
    const text = card.text()
    expect(text).toContain('17,996')
    expect(text).toContain('3,200')
    expect(text).toContain('Chips packed into plastic')
    expect(text).toContain('pushes chips down')
    expect(text).toContain('Clean cuts ran at about 18,000 rpm')
    expect(text).toContain('local codes govern')
    await card.find('button').trigger('click')
    expect(card.emitted('use')).toEqual([[{ rpm: 17996, feedMmPerMin: 3199.7 }]])
  })
})
