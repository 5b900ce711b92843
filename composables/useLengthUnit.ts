// The unit the signed-in person reads lengths in. The preferences store holds it; /api/me
// fills it (as the account page does), so a page opened straight from a label shows the right unit.
import { usePreferencesStore } from '~~/stores/preferences'

export function useLengthUnit() {
  const prefs = usePreferencesStore()
  const { data: me } = useMe()
  watch(() => me.value?.lengthUnit, (unit) => { if (unit) prefs.lengthUnit = unit }, { immediate: true })
  return computed(() => prefs.lengthUnit)
}
