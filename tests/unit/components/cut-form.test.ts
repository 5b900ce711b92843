// @vitest-environment nuxt
// The cut form in a Nuxt environment: a field's message goes as soon as the field is put right,
// and minutes far from usual ask "Log 600 min?" before anything is sent.
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import CutLogForm from '~/components/spindle/CutLogForm.vue'

const cutter = { id: 7, code: 'K7Q2M9P', machine: null, type: { id: 3, profile: 'square_end' as const }, usual: { shiftMinutes: 720, longestCutMinutes: 45 } }
const materials = [{ id: 1, name: 'MDF', family: 'sheet_goods' as const, wearFactor: 1, common: true }]

async function form() {
  return mountSuspended(CutLogForm, { props: { cutter, materials, unit: 'mm' as const } })
}

describe('the cut form', () => {
  it('takes a field\'s message away as soon as the field is fixed, leaving the others', async () => {
    const wrapper = await form()
    await wrapper.find('form').trigger('submit')
    expect(wrapper.text()).toContain('Enter the minutes cut')
    expect(wrapper.text()).toContain('Choose the material that was cut.')
    await wrapper.find('input[name="minutes"]').setValue('30')
    expect(wrapper.text()).not.toContain('Enter the minutes cut')
    expect(wrapper.text()).toContain('Choose the material that was cut.')
  })

  it('asks "Log 600 min?" before logging ten hours on a type whose longest cut was 45 minutes', async () => {
    const wrapper = await form()
    await wrapper.find('input[name="minutes"]').setValue('600')
    const buttons = () => wrapper.findAll('button')
    await buttons().find((b) => b.text() === 'MDF')!.trigger('click')
    await buttons().find((b) => b.text().startsWith('Clean'))!.trigger('click')
    await wrapper.find('form').trigger('submit')
    expect(wrapper.text()).toContain('Log 600 min?')
    expect(wrapper.text()).toContain('more than 4 times the longest cut logged on this type of bit (45 min)')
    expect(wrapper.emitted('done')).toBeUndefined()
    // Changing the minutes takes the question away.
    await wrapper.find('input[name="minutes"]').setValue('60')
    expect(wrapper.text()).not.toContain('Log 600 min?')
  })
})
