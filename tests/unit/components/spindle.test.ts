// @vitest-environment nuxt
// The spindle's glanceable parts in a Nuxt environment: the life bar's words and colours at the
// resharpen mark and past a whole life, and the minutes left in the shop's common materials.
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import LifeBar from '~/components/spindle/LifeBar.vue'
import RemainingMinutes from '~/components/spindle/RemainingMinutes.vue'

async function bar(used: number, threshold = 0.9) {
  const wrapper = await mountSuspended(LifeBar, { props: { used, threshold } })
  const fill = wrapper.find('[role="meter"] > div')
  return { wrapper, text: wrapper.text().replace(/\s+/g, ' '), fill: fill.classes(), tone: wrapper.attributes('data-tone') }
}

describe('the life bar', () => {
  it('says how much of this sharp life is used, in words', async () => {
    const { text, tone, fill, wrapper } = await bar(0.72)
    expect(text).toContain('72 % of this sharp life used')
    expect(text).toContain('Resharpen mark at 90 %')
    expect(tone).toBe('ok')
    expect(fill).toContain('bg-spruce-600')
    expect(wrapper.find('[role="meter"]').attributes('aria-valuenow')).toBe('72')
  })

  it('stays green just below the mark and never reads as the mark before it is reached', async () => {
    const { text, tone, fill } = await bar(0.8999)
    expect(text).toContain('89 % of this sharp life used')
    expect(tone).toBe('ok')
    expect(fill).not.toContain('bg-chip-400')
  })

  it('turns amber exactly at the mark, and says so', async () => {
    const { text, tone, fill } = await bar(0.9)
    expect(text).toContain('90 % of this sharp life used')
    expect(text).toContain('At the resharpen mark (90 %)')
    expect(tone).toBe('due')
    expect(fill).toContain('bg-chip-400')
  })

  it('stays amber at a whole life used and turns ember only past it', async () => {
    expect((await bar(1)).tone).toBe('due')
    const past = await bar(1.12)
    expect(past.text).toContain('112 % of this sharp life used')
    expect(past.text).toContain('Past its whole sharp life')
    expect(past.tone).toBe('past')
    expect(past.fill).toContain('bg-ember-600')
    // The bar itself stops at full; the marker sits on the mark.
    expect(past.wrapper.find('[role="meter"] > div').attributes('style')).toContain('width: 100%')
    expect(past.wrapper.find('[role="meter"] > div[aria-hidden]').attributes('style')).toContain('left: 90%')
  })

  it('follows the shop\'s own mark', async () => {
    const { tone, text } = await bar(0.8, 0.8)
    expect(tone).toBe('due')
    expect(text).toContain('(80 %)')
  })
})

describe('remaining minutes', () => {
  it('shows the common materials only, in hours and minutes, and "none" when used up', async () => {
    const wrapper = await mountSuspended(RemainingMinutes, {
      props: {
        items: [
          { materialId: 1, materialName: 'MDF', common: true, wearFactor: 1, minutes: 312.4 },
          { materialId: 2, materialName: 'HDPE', common: true, wearFactor: 0.8, minutes: 45 },
          { materialId: 3, materialName: 'Aluminium 6061', common: false, wearFactor: 3, minutes: 20 },
          { materialId: 4, materialName: 'Plywood', common: true, wearFactor: 1.2, minutes: 0 },
        ],
      },
    })
    const text = wrapper.text()
    expect(text).toContain('MDF5 h 12 min')
    expect(text).toContain('HDPE45 min')
    expect(text).toContain('Plywoodnone')
    expect(text).not.toContain('Aluminium')
  })
})
