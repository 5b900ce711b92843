// The signed-in person's display preferences, shared by every page that shows a length.
import { defineStore } from 'pinia'

export type LengthUnit = 'mm' | 'in'

export const usePreferencesStore = defineStore('preferences', () => {
  const lengthUnit = ref<LengthUnit>('mm')

  async function setLengthUnit(unit: LengthUnit) {
    const previous = lengthUnit.value
    lengthUnit.value = unit
    try {
      await $fetch('/api/me', { method: 'PATCH', body: { lengthUnit: unit } })
    } catch (err) {
      lengthUnit.value = previous
      throw err
    }
  }

  return { lengthUnit, setLengthUnit }
})
