// A draft order's lines as the form holds them (text) and as the API takes them (whole numbers
// and cents); text that does not read as a number goes as text, so the server's message names
// the field.
import { parseMoney } from '#shared/kerf/money'

export interface DraftLine { typeId: number, typeName: string, quantity: string, price: string }

export function orderLinesBody(lines: readonly DraftLine[]) {
  return lines.map((l) => {
    const qty = l.quantity.trim()
    return {
      typeId: l.typeId,
      quantity: /^\d+$/.test(qty) ? Number(qty) : qty,
      unitCostCents: parseMoney(l.price) ?? l.price,
    }
  })
}
