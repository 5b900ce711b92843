// Dates and times shown one way on every page: in the reader's locale and on the shop's clock
// (shared/kerf/dates.ts). The server takes the locale from the request's Accept-Language and
// hands it to the browser in the page's state, so both render the same words (no hydration
// mismatch); a page the server never rendered (the offline shell) asks the browser instead.
import { pickLocale, showAge, showDate, showDateTime, showDay, showShortDateTime, showTime, type DateStyle } from '#shared/kerf/dates'
import { useOfflineCopyStore } from '~~/stores/offlineCopy'

export function useLocale() {
  return useState('locale', () => (import.meta.server
    ? pickLocale(useRequestHeaders(['accept-language'])['accept-language'])
    : pickLocale(navigator.languages?.length ? navigator.languages.join(',') : navigator.language)))
}

/**
 * The shop's IANA time zone: from the signed-in person's shop, else the phone's copy, else UTC.
 * It reads what the layout's useMe() fetched (before its page renders, on the server too)
 * rather than starting a fetch in every date of a long table.
 */
export function useShopTimeZone() {
  const { data: me } = useNuxtData<{ shop: { timeZone: string } } | null>('me')
  const offline = import.meta.client ? useOfflineCopyStore() : null
  return computed(() => me.value?.shop.timeZone ?? offline?.copy?.shop.timeZone ?? 'UTC')
}

export function useDates() {
  const locale = useLocale()
  const timeZone = useShopTimeZone()
  const style = computed<DateStyle>(() => ({ locale: locale.value, timeZone: timeZone.value }))
  return {
    locale,
    timeZone,
    /** The shop's day of a moment: "3 Dec 2026". */
    date: (at: string | Date) => showDate(at, style.value),
    /** "3 Dec 2026, 14:05". */
    dateTime: (at: string | Date) => showDateTime(at, style.value),
    /** "Thu 3 Dec, 14:05". */
    shortDateTime: (at: string | Date) => showShortDateTime(at, style.value),
    time: (at: string | Date) => showTime(at, style.value),
    /** A calendar day 'YYYY-MM-DD' that is already the shop's day. */
    day: (day: string) => showDay(day, locale.value),
    /** "5 minutes ago". */
    age: (at: string | Date, now: Date) => showAge(at, now, locale.value),
  }
}
