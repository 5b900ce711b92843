// Shows lengths in the signed-in person's unit (mm or inches), kept in the preferences store.
import { formatLength, toMm } from '#shared/kerf/units'
import { usePreferencesStore } from '~~/stores/preferences'

export function useLength() {
  const prefs = usePreferencesStore()
  const { data: me } = useMe()
  // The store starts at mm; the account's own choice wins once it is known.
  watch(() => me.value?.lengthUnit, (unit) => {
    if (unit && !prefs.loadedFromAccount) {
      prefs.lengthUnit = unit
      prefs.loadedFromAccount = true
    }
  }, { immediate: true })
  const unit = computed(() => prefs.lengthUnit)
  return {
    unit,
    format: (mm: number | null | undefined) => (mm === null || mm === undefined ? '—' : formatLength(mm, prefs.lengthUnit)),
    toMm: (value: number) => toMm(value, prefs.lengthUnit),
  }
}
