// @vitest-environment nuxt
// The bit chooser in a Nuxt environment: it asks for the material before it asks the server, and
// a shop with no cutter types gets an empty state that says where types are added.
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { flushPromises } from '@vue/test-utils'
import { describe, expect, it } from 'vitest'
import BitChooser from '~/components/spindle/BitChooser.vue'

let asked = 0
registerEndpoint('/api/materials', () => [{ id: 7, name: 'HDPE', family: 'soft_plastic', wearFactor: 0.6, common: true }])
registerEndpoint('/api/machines', () => [])
registerEndpoint('/api/bit-choice', () => {
  asked++
  return []
})

describe('the bit chooser', () => {
  it('names what is missing and asks nothing of the server until the material is chosen', async () => {
    const chooser = await mountSuspended(BitChooser)
    await flushPromises()
    await chooser.find('form').trigger('submit')
    await flushPromises()
    expect(chooser.text()).toContain('Choose the material.')
    expect(asked).toBe(0)
  })

  it('says where to add cutter types when the shop has none', async () => {
    const chooser = await mountSuspended(BitChooser)
    await flushPromises()
    const hdpe = chooser.findAll('button').find((b) => b.text() === 'HDPE')!
    await hdpe.trigger('click')
    await chooser.find('form').trigger('submit')
    await flushPromises()
    expect(asked).toBe(1)
    expect(chooser.text()).toContain('The shop has no cutter types yet')
    expect(chooser.text()).toContain('Ask the crib manager to add the shop\'s bits in the catalogue')
  })
})
