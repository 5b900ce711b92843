// Money in the shop's currency: integer cents to "$1,234.56" (or CA$, €, £, A$).
import { showMoney, type Currency } from '#shared/kerf/money'

export function useMoney() {
  const { data: me } = useMe()
  const currency = computed<Currency>(() => me.value?.shop.currency ?? 'USD')
  return (cents: number | null | undefined) => showMoney(cents, currency.value)
}
