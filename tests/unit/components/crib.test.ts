// @vitest-environment nuxt
// The crib's small pieces in a Nuxt environment: status and due badges, the life bar, and a
// history line for an event and for a cut (feed in the reader's unit).
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import HistoryEntry from '~/components/crib/HistoryEntry.vue'
import LifeBar from '~/components/crib/LifeBar.vue'
import StatusBadge from '~/components/crib/StatusBadge.vue'

registerEndpoint('/api/me', () => ({ id: 1, name: 'Test Crib', role: 'crib_manager', lengthUnit: 'in', shop: { id: 1, name: 'Test shop' } }))

describe('crib badges', () => {
  it('names the status, a dull flag and what is due', async () => {
    const text = (await mountSuspended(StatusBadge, { props: { status: 'in_crib', flagged: 'dull', due: 'retire' } })).text()
    expect(text).toContain('In the crib')
    expect(text).toContain('Flagged dull')
    expect(text).toContain('Retire')
    expect((await mountSuspended(StatusBadge, { props: { status: 'lost' } })).text()).toBe('Lost')
  })

  it('the life bar shows the percentage and turns amber at the threshold', async () => {
    const fresh = await mountSuspended(LifeBar, { props: { value: 0.42, threshold: 0.9 } })
    expect(fresh.text()).toBe('42 %')
    expect(fresh.html()).toContain('bg-spruce-500')
    expect((await mountSuspended(LifeBar, { props: { value: 0.93, threshold: 0.9 } })).html()).toContain('bg-chip-500')
  })
})

describe('a history line', () => {
  it('an event says what happened, who did it and the change of status', async () => {
    const wrapper = await mountSuspended(HistoryEntry, {
      props: { entry: { source: 'event', id: 'e1', at: '2026-11-30T13:36:00.000Z', who: 'Jonah Pell', machineName: 'Big Bay', note: '', kind: 'loaded', fromStatus: 'in_crib', toStatus: 'in_spindle', photoId: null } },
    })
    const text = wrapper.text()
    expect(text).toContain('Loaded into Big Bay')
    expect(text).toContain('by Jonah Pell')
    expect(text).toContain('In the crib → In a spindle')
    expect(wrapper.find('time').attributes('title')).toBe('2026-11-30 13:36 UTC')
  })

  it('a cut gives minutes, material, outcome, life and the feed in inches for an inch reader', async () => {
    const wrapper = await mountSuspended(HistoryEntry, {
      props: {
        entry: {
          source: 'cut', id: 'c1', at: '2026-11-30T13:26:00.000Z', who: 'Jonah Pell', machineName: 'Big Bay', note: 'sign faces',
          materialName: 'MDF', minutes: 45.5, outcome: 'chip_out', rpm: 18000, feedMmPerMin: 2540, lifeAdded: 0.038, loggedAt: '2026-11-30T13:27:00.000Z',
        },
      },
    })
    await new Promise((r) => setTimeout(r, 50))
    const text = wrapper.text()
    expect(text).toContain('Cut 45.5 min of MDF')
    expect(text).toContain('Chip-out')
    expect(text).toContain('3.8 % of a life')
    expect(text).toContain('18,000 rpm')
    expect(text).toContain('100.0 in/min')
    expect(text).toContain('sign faces')
  })
})
