// The signed-in person's display preferences, shared by every page that shows a length.
import { defineStore } from 'pinia'

import type { LengthUnit } from '#shared/kerf/units'

export type { LengthUnit }

export const usePreferencesStore = defineStore('preferences', () => {
  const lengthUnit = ref<LengthUnit>('mm')
  // Set once the account's saved unit has been read, so a later page load does not undo a change.
  const loadedFromAccount = ref(false)

  async function setLengthUnit(unit: LengthUnit) {
    const previous = lengthUnit.value
    lengthUnit.value = unit
    loadedFromAccount.value = true
    try {
      await $fetch('/api/me', { method: 'PATCH', body: { lengthUnit: unit } })
    } catch (err) {
      lengthUnit.value = previous
      throw err
    }
  }

  return { lengthUnit, loadedFromAccount, setLengthUnit }
})
