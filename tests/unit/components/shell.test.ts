// @vitest-environment nuxt
// The shell in a Nuxt environment: navigation follows the role, and the home components show
// the figures they are given (and say so plainly when there is nothing).
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import StatusCounts from '~/components/home/StatusCounts.vue'
import DueList from '~/components/home/DueList.vue'
import GettingReady from '~/components/home/GettingReady.vue'
import { GETTING_READY_STEPS } from '#shared/kerf/getting-ready'
import { navigationFor } from '~/composables/useNavigation'

describe('navigation', () => {
  it('offers the scanner to every role', () => {
    for (const role of ['operator', 'crib_manager', 'owner'] as const) expect(navigationFor(role).map((i) => i.to)).toContain('/scan')
  })

  it('shows the team and insights pages to owners only', () => {
    expect(navigationFor('owner').map((i) => i.to)).toContain('/team')
    expect(navigationFor('owner').find((i) => i.to === '/insights')).toMatchObject({ label: 'Insights', icon: 'insights', phone: false })
    expect(navigationFor('crib_manager').map((i) => i.to)).not.toContain('/team')
    expect(navigationFor('operator').map((i) => i.to)).toEqual(['/', '/scan', '/feeds', '/programs', '/account'])
    expect(navigationFor('crib_manager').map((i) => i.to)).toEqual(['/', '/scan', '/feeds', '/programs', '/crib', '/reports', '/account'])
    expect(navigationFor(undefined)).toEqual([])
  })

  it('keeps the phone bar to four items for every role; the feeds calculator sits on Account', () => {
    for (const role of ['operator', 'crib_manager', 'owner'] as const) {
      expect(navigationFor(role).filter((i) => i.phone).length).toBeLessThanOrEqual(4)
      expect(navigationFor(role).find((i) => i.to === '/feeds')).toMatchObject({ phone: false, icon: 'feeds' })
    }
  })
})

describe('home components', () => {
  it('status tiles show every status with its count', async () => {
    const wrapper = await mountSuspended(StatusCounts, {
      props: { counts: { in_crib: 41, in_spindle: 9, at_regrind: 6, retired: 12, lost: 2 } },
    })
    const text = wrapper.text()
    expect(text).toContain('41In the crib')
    expect(text).toContain('6Out for regrind')
    expect(wrapper.findAll('li')).toHaveLength(5)
  })

  it('the due list explains itself when empty, and names reason and action otherwise', async () => {
    const empty = await mountSuspended(DueList, { props: { cutters: [], threshold: 0.9 } })
    expect(empty.text()).toContain('Nothing is due')
    expect(empty.text()).toContain('90 %')

    const full = await mountSuspended(DueList, {
      props: {
        threshold: 0.9,
        cutters: [
          { id: 1, code: 'K7Q2M9P', typeName: 'O-flute 1/4"', status: 'in_spindle', machineName: 'Big Bay', lifeUsed: 0.93, reason: 'life_used', action: 'resharpen' },
          { id: 2, code: 'ZX4H8NA', typeName: 'V-bit 60°', status: 'in_crib', machineName: null, lifeUsed: 0.2, reason: 'flagged_dull', action: 'retire' },
        ],
      },
    })
    const text = full.text()
    expect(text).toContain('93 % of life used')
    expect(text).toContain('Flagged dull')
    expect(text).toContain('Retire')
    expect(text).toContain('In the crib')
  })
})

describe('getting ready on Home', () => {
  const steps = (done: (key: string) => boolean, to: (s: typeof GETTING_READY_STEPS[number]) => string | null = (s) => s.to) =>
    GETTING_READY_STEPS.map((s) => ({ ...s, to: to(s), done: done(s.key) }))

  it('links each open step to the page that does it and ticks the done ones without a link', async () => {
    const wrapper = await mountSuspended(GettingReady, { props: { steps: steps((k) => k === 'machine' || k === 'supplier') } })
    expect(wrapper.find('h2').text()).toBe('Getting ready')
    expect(wrapper.text()).toContain('5 steps left')
    const links = wrapper.findAll('a')
    expect(links.map((a) => a.attributes('href'))).toEqual(['/crib/materials', '/crib/catalogue', '/crib/orders', '/team', '/scan'])
    expect(links[0]!.text()).toContain('Check your materials')
    const machine = wrapper.find('[data-step="machine"]')
    expect(machine.element.tagName).toBe('DIV')
    expect(machine.text()).toContain('(done)')
  })

  it('tells a crib manager that the owner invites people, with no dead link', async () => {
    const wrapper = await mountSuspended(GettingReady, { props: { steps: steps(() => false, (s) => s.key === 'operator' ? null : s.to) } })
    expect(wrapper.findAll('a').map((a) => a.attributes('href'))).not.toContain('/team')
    expect(wrapper.find('[data-step="operator"]').text()).toContain('The owner invites people on the Team page.')
  })

  it('goes away once every step is done', async () => {
    const one = await mountSuspended(GettingReady, { props: { steps: steps((k) => k !== 'firstCut') } })
    expect(one.text()).toContain('One step left')
    const done = await mountSuspended(GettingReady, { props: { steps: steps(() => true) } })
    expect(done.find('section').exists()).toBe(false)
    expect(done.text()).toBe('')
  })
})
