// The sharp lives behind learned wear (server/utils/insights/wear.ts), read from the
// cut_sharp_lives roll-up as one text of a line a life and scanned once into the columns the wear
// model takes. A row a life with its jsonb parsed into an object cost node-postgres more than the
// whole fit (30,000 lives); one text scanned here costs a fraction of that and makes no object a
// life (docs/performance.md).
import { sql } from 'kysely'
import type { LifeColumns } from '#shared/kerf/wear-model'
import type { DateRange } from '#shared/kerf/date-range'
import type { Queryable } from '../../db/connect'

const NEWLINE = 10, MINUS = 45, DOT = 46, ZERO = 48, NINE = 57, BRACE_CLOSE = 125
/** What may stand between numbers: space, comma, colon, quote and braces (jsonb's print). */
const SEPARATOR = new Uint8Array(BRACE_CLOSE + 1)
for (const c of ' ,:"{}') SEPARATOR[c.charCodeAt(0)] = 1
/** Exact powers of ten. */
const TEN = Float64Array.from({ length: 16 }, (_, k) => 10 ** k)

/**
 * Every sharp life of the shop whose last cut is in the range, in columns (lives with no rated
 * life left out).
 */
export async function readSharpLives(db: Queryable, shopId: number, range: Pick<DateRange, 'start' | 'end'>): Promise<LifeColumns> {
  // Every life whose last cut is in the range. It ended by wear when the cutter was reground
  // since (its count moved on), or it is the current life and the cutter went dull, is out for
  // resharpening or was retired worn out or undersize. Every other life is censored where it
  // stands: still cutting, broken, lost or retired for another reason. Rated life × life scale
  // as each log had it, recovered from life_added / wear factor: so a later catalogue edit or a
  // changed regrind fraction does not reshape old lives. A line a life, as parseLifeLines reads it.
  const row = await sql<{ lives: string | null }>`
    select string_agg(concat_ws(' ', c.type_id,
      coalesce(c.regrind_count > l.regrind_count or (c.regrind_count = l.regrind_count and (
        c.flagged = 'dull' or c.status = 'at_regrind' or (c.status = 'retired' and c.retired_reason in ('worn', 'undersize')))), false)::int,
      coalesce(l.minutes / nullif(l.sharp_share, 0), 0),
      l.material_minutes), E'\n') as lives
    from cut_sharp_lives l
    join cutters c on c.id = l.cutter_id and c.shop_id = l.shop_id
    where l.shop_id = ${shopId} and l.last_cut_at >= ${range.start} and l.last_cut_at < ${range.end}`
    .execute(db)
  return parseLifeLines(row.rows[0]?.lives ?? '')
}

/**
 * Reads lines of `type worn rated {"material": minutes, ...}`: the cutter type's id, 1 when the
 * life ended by wear (0 when censored), the rated life × life scale in minutes, and the life's
 * minutes by material id as PostgreSQL prints a jsonb object. Lives with no positive rated life
 * are left out (the model needs one). Numbers read exactly as `Number` reads them.
 */
export function parseLifeLines(text: string): LifeColumns {
  // A line a life, a colon a cut: three numbers a line and two a cut.
  let lines = text.length ? 1 : 0, pairs = 0
  for (let x = text.indexOf('\n'); x >= 0; x = text.indexOf('\n', x + 1)) lines++
  for (let x = text.indexOf(':'); x >= 0; x = text.indexOf(':', x + 1)) pairs++
  const numbers = new Float64Array(3 * lines + 2 * pairs)
  const lineEnds = new Int32Array(lines)

  // First every number in one tight loop (this runs over megabytes), noting where lines end.
  let count = 0, line = 0
  const length = text.length
  for (let i = 0; i < length; i++) {
    let c = text.charCodeAt(i)
    if ((c >= ZERO && c <= NINE) || c === MINUS) {
      const from = i
      let v = 0, digits = 0, decimals = 0
      if (c === MINUS) c = ++i < length ? text.charCodeAt(i) : 0
      while (c >= ZERO && c <= NINE) { v = v * 10 + (c - ZERO); digits++; c = ++i < length ? text.charCodeAt(i) : 0 }
      if (c === DOT) {
        c = ++i < length ? text.charCodeAt(i) : 0
        while (c >= ZERO && c <= NINE) { v = v * 10 + (c - ZERO); digits++; decimals++; c = ++i < length ? text.charCodeAt(i) : 0 }
      }
      if (!digits || count === numbers.length) throw new Error(`unexpected number at ${from} of the lives' text`)
      // Up to 15 digits the integer and the power of ten are exact, so one division rounds as
      // Number does; longer numbers (a numeric quotient) go through Number itself.
      numbers[count++] = digits > 15 ? Number(text.slice(from, i)) : text.charCodeAt(from) === MINUS ? -v / TEN[decimals]! : v / TEN[decimals]!
      i-- // the loop steps onto the character after the number
    } else if (c === NEWLINE) {
      lineEnds[line++] = count
    } else if (c > BRACE_CLOSE || !SEPARATOR[c]) {
      throw new Error(`unexpected "${text[i]}" at ${i} of the lives' text`)
    }
  }
  if (line < lines) lineEnds[line++] = count

  // Then line by line: type, worn, rated, then material and minutes by turns.
  const typeId = new Int32Array(line), ratedLifeMinutes = new Float64Array(line), wornOut = new Uint8Array(line)
  const start = new Int32Array(line + 1), materialId = new Int32Array(pairs), minutes = new Float64Array(pairs)
  let life = 0, cut = 0, from = 0
  for (let l = 0; l < line; l++) {
    const to = lineEnds[l]!
    if (to === from && l === line - 1) break // a newline at the very end
    if (to - from < 3 || (to - from) % 2 === 0) throw new Error(`line ${l + 1} of the lives' text has ${to - from} numbers`)
    const rated = numbers[from + 2]!
    if (rated > 0) {
      typeId[life] = numbers[from]!
      wornOut[life] = numbers[from + 1] ? 1 : 0
      ratedLifeMinutes[life++] = rated
      for (let q = from + 3; q < to; q += 2) { materialId[cut] = numbers[q]!; minutes[cut++] = numbers[q + 1]! }
      start[life] = cut
    }
    from = to
  }
  return {
    typeId: typeId.subarray(0, life), ratedLifeMinutes: ratedLifeMinutes.subarray(0, life), wornOut: wornOut.subarray(0, life),
    start: start.subarray(0, life + 1), materialId: materialId.subarray(0, cut), minutes: minutes.subarray(0, cut),
  }
}
