// An insights route's range of days, counted in the shop's own time zone.
import { resolveRange, type DateRange } from '#shared/kerf/date-range'
import { useDb } from '../platform/db'
import { shopTimeZone } from '../platform/shop-settings'

export async function insightsRange(shopId: number, query: { from?: string, to?: string }): Promise<DateRange> {
  return resolveRange(query, await shopTimeZone(useDb(), shopId))
}
