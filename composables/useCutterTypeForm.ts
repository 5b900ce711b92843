// The cutter type form's state as people type it (lengths in their unit, money in dollars, the
// service level in percent) and the body the API takes (mm, cents, a fraction), checked with the
// same schema the server uses before it is sent.
import type { LengthUnit } from '#shared/kerf/units'
import { formatMoney, parseMoney } from '#shared/kerf/money'
import { lengthText, parseDecimal, parseLength, parseServiceLevel, roundTo } from '#shared/kerf/numbers'
import { CutterTypeBody } from '#shared/schemas/crib'
import type { Helix, Profile, ToolMaterial } from '#shared/kerf/geometry'
import type { CutterTypeJson } from '~~/server/utils/crib/catalogue'

export const LENGTH_FIELDS = ['cuttingDiameterMm', 'shankDiameterMm', 'cuttingLengthMm', 'overallLengthMm', 'minUsableDiameterMm', 'regrindDiameterLossMm'] as const
export type LengthField = (typeof LENGTH_FIELDS)[number]

const blank = (text: string) => text.trim() === ''
// Text that does not read as a number goes to the schema as text, so its message names the field.
const num = (text: string) => (blank(text) ? undefined : parseDecimal(text) ?? text)

export function useCutterTypeForm(initial: CutterTypeJson | undefined) {
  const { unit } = useLength()
  const stored = Object.fromEntries(LENGTH_FIELDS.map((f) => [f, initial?.[f] ?? (f === 'regrindDiameterLossMm' ? 0.2 : null)])) as Record<LengthField, number | null>
  // A length shown and not retyped goes back as stored, not re-rounded through inches.
  const shown = reactive({} as Record<LengthField, string>)
  const lengths = reactive({} as Record<LengthField, string>)
  for (const f of LENGTH_FIELDS) shown[f] = lengths[f] = lengthText(stored[f], unit.value)

  const form = reactive({
    name: initial?.name ?? '',
    supplierId: initial?.supplierId ?? null as number | null,
    supplierPartNumber: initial?.supplierPartNumber ?? '',
    profile: (initial?.profile ?? 'square_end') as Profile,
    vAngleDeg: initial?.vAngleDeg === null || initial?.vAngleDeg === undefined ? '' : String(initial.vAngleDeg),
    helix: (initial?.helix ?? 'upcut') as Helix,
    toolMaterial: (initial?.toolMaterial ?? 'solid_carbide') as ToolMaterial,
    flutes: initial ? String(initial.flutes) : '2',
    ratedLifeMinutes: initial ? String(initial.ratedLifeMinutes) : '',
    maxRegrinds: String(initial?.maxRegrinds ?? 2),
    unitCost: initial ? formatMoney(initial.unitCostCents) : '',
    regrindCost: formatMoney(initial?.regrindCostCents ?? 0),
    packSize: String(initial?.packSize ?? 1),
    serviceLevel: String(roundTo((initial?.serviceLevel ?? 0.95) * 100, 2)),
    leadTimeDaysOverride: initial?.leadTimeDaysOverride === null || initial?.leadTimeDaysOverride === undefined ? '' : String(initial.leadTimeDaysOverride),
  })

  function lengthMm(f: LengthField, inUnit: LengthUnit = unit.value): number | string | undefined {
    if (lengths[f] === shown[f] && stored[f] !== null) return stored[f]!
    return blank(lengths[f]) ? undefined : parseLength(lengths[f], inUnit) ?? lengths[f]
  }

  // Someone who switches units mid-form keeps what they typed, converted.
  watch(unit, (now, before) => {
    for (const f of LENGTH_FIELDS) {
      const mm = lengthMm(f, before)
      shown[f] = lengthText(stored[f], now)
      if (typeof mm === 'number') lengths[f] = mm === stored[f] ? shown[f] : lengthText(mm, now)
    }
  })

  function body() {
    return {
      name: form.name,
      supplierId: form.supplierId,
      supplierPartNumber: form.supplierPartNumber,
      profile: form.profile,
      vAngleDeg: form.profile === 'v_bit' ? num(form.vAngleDeg) ?? null : null,
      helix: form.helix,
      toolMaterial: form.toolMaterial,
      flutes: num(form.flutes),
      ...Object.fromEntries(LENGTH_FIELDS.map((f) => [f, lengthMm(f)])),
      ratedLifeMinutes: num(form.ratedLifeMinutes),
      maxRegrinds: num(form.maxRegrinds),
      unitCostCents: blank(form.unitCost) ? undefined : parseMoney(form.unitCost) ?? form.unitCost,
      regrindCostCents: blank(form.regrindCost) ? undefined : parseMoney(form.regrindCost) ?? form.regrindCost,
      packSize: num(form.packSize),
      serviceLevel: blank(form.serviceLevel) ? undefined : parseServiceLevel(form.serviceLevel) ?? form.serviceLevel,
      leadTimeDaysOverride: blank(form.leadTimeDaysOverride) ? null : num(form.leadTimeDaysOverride),
    }
  }

  /** The schema's messages by field, before anything is sent; null when the form is fine. */
  function check(): Record<string, string> | null {
    const result = CutterTypeBody.safeParse(body())
    if (result.success) return null
    const fields: Record<string, string> = {}
    for (const issue of result.error.issues) fields[String(issue.path[0] ?? '_')] ??= issue.message
    return fields
  }

  /** Under a length: the same length in the other unit, so nobody wonders what was stored. */
  function lengthHint(f: LengthField): string | undefined {
    const mm = lengthMm(f)
    if (typeof mm !== 'number') return undefined
    return unit.value === 'in' ? `= ${mm} mm` : `= ${roundTo(mm / 25.4, 4)} in`
  }

  return { form, lengths, unit, body, check, lengthHint }
}
