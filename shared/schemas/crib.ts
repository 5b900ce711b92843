// Inputs of the catalogue and supplier routes, shared with their forms and the CSV import.
// Lengths in millimetres, money in integer cents, the service level as a fraction.
import { z } from 'zod'
import { HELIXES, PROFILES, TOOL_MATERIALS } from '../kerf/geometry'
import { Email } from './auth'
import { Day } from './dates'

export const IdParams = z.object({ id: z.coerce.number().int().positive().max(2_147_483_647) })

// Transforms keep undefined as undefined, so a PATCH that leaves a field out never clears it.
const blankToNull = (v: unknown) => (typeof v === 'string' && v.trim() === '' ? null : v)

const Name = z.string({ error: 'enter a name' }).trim().min(1, { error: 'enter a name' }).max(120, { error: 'use at most 120 characters' })
// Figures are stored at the precision of their numeric columns (lengths to 0.001 mm, minutes to
// 0.01): a smaller figure would round to 0 there and break the column's check.
const Length = z.number({ error: 'enter a length' })
  .min(0.001, { error: 'must be at least 0.001 mm' })
  .max(1000, { error: 'must be at most 1000 mm' })
const Whole = (what: string, min: number, max: number) => z.number({ error: `enter ${what}` })
  .int({ error: 'must be a whole number' })
  .min(min, { error: `must be ${min} to ${max}` })
  .max(max, { error: `must be ${min} to ${max}` })
const Cents = z.number({ error: 'enter an amount like 42.50' })
  .int({ error: 'must be whole cents' })
  .min(0, { error: 'cannot be negative' })
  .max(10_000_000, { error: 'must be at most 100000.00' })

export const CutterTypeFields = z.object({
  name: Name,
  supplierId: z.number({ error: 'choose a supplier' }).int().positive().max(2_147_483_647).nullish(),
  supplierPartNumber: z.preprocess(blankToNull, z.string().trim().max(80, { error: 'use at most 80 characters' }).nullish()),
  profile: z.enum(PROFILES, { error: 'choose square end, ball nose, V-bit or O-flute' }),
  vAngleDeg: z.number({ error: 'enter the included angle in degrees' })
    .min(0.01, { error: 'must be between 0 and 180 degrees' }).max(179.99, { error: 'must be between 0 and 180 degrees' }).nullish(),
  helix: z.enum(HELIXES, { error: 'choose upcut, downcut, compression or straight' }),
  toolMaterial: z.enum(TOOL_MATERIALS, { error: 'choose solid carbide, carbide-tipped or HSS' }).optional(),
  flutes: Whole('the number of flutes', 1, 12),
  cuttingDiameterMm: Length,
  shankDiameterMm: Length,
  cuttingLengthMm: Length,
  overallLengthMm: Length,
  ratedLifeMinutes: z.number({ error: 'enter the rated life in minutes' })
    .min(0.01, { error: 'must be at least 0.01 minutes' }).max(1_000_000, { error: 'must be at most 1000000 minutes' }),
  maxRegrinds: Whole('the most regrinds', 0, 20).optional(),
  regrindDiameterLossMm: z.number({ error: 'enter a length' })
    .min(0, { error: 'cannot be negative' }).max(100, { error: 'must be at most 100 mm' }).optional(),
  minUsableDiameterMm: Length,
  unitCostCents: Cents,
  regrindCostCents: Cents.optional(),
  packSize: Whole('the pack size', 1, 10_000).optional(),
  serviceLevel: z.number({ error: 'enter a percentage like 95' })
    .min(0.5, { error: 'must be 50 % to 99.99 %' }).max(0.9999, { error: 'must be 50 % to 99.99 %' }).optional(),
  leadTimeDaysOverride: Whole('a number of days', 0, 365).nullish(),
  // The shop's own word: keep at least / at most this many, and sharp spares per machine.
  minOnHand: Whole('a number of cutters', 0, 10_000).nullish(),
  maxOnHand: Whole('a number of cutters', 0, 10_000).nullish(),
  sparesPerMachine: z.number({ error: 'enter a number of spares' }).int({ error: 'must be a whole number' })
    .min(0, { error: 'cannot be negative' }).max(100, { error: 'must be at most 100' }).nullish(),
  doNotReorder: z.boolean({ error: 'must be true or false' }).optional(),
})
export type CutterTypeInput = z.input<typeof CutterTypeFields>
export type CutterTypeValue = z.output<typeof CutterTypeFields>

export interface GeometryForChecks {
  profile: string
  vAngleDeg?: number | null
  cuttingDiameterMm: number
  minUsableDiameterMm: number
  cuttingLengthMm: number
  overallLengthMm: number
  minOnHand?: number | null
  maxOnHand?: number | null
}

/** The rules between fields (the database has matching CHECKs): each broken one, by field. */
export function geometryProblems(t: GeometryForChecks): Record<string, string> {
  const problems: Record<string, string> = {}
  if (t.minOnHand != null && t.maxOnHand != null && t.minOnHand > t.maxOnHand) problems.maxOnHand = 'must be at least the minimum on hand'
  if (t.overallLengthMm < t.cuttingLengthMm) problems.overallLengthMm = 'must be at least the cutting length'
  if (t.minUsableDiameterMm > t.cuttingDiameterMm) problems.minUsableDiameterMm = 'must be at most the cutting diameter'
  const hasAngle = t.vAngleDeg !== null && t.vAngleDeg !== undefined
  if (t.profile === 'v_bit' && !hasAngle) problems.vAngleDeg = 'a V-bit needs its included angle'
  if (t.profile !== 'v_bit' && hasAngle) problems.vAngleDeg = 'only a V-bit has an included angle: clear it or choose V-bit'
  return problems
}

export const CutterTypeBody = CutterTypeFields.superRefine((t, ctx) => {
  for (const [field, message] of Object.entries(geometryProblems(t))) {
    ctx.addIssue({ code: 'custom', path: [field], message })
  }
})

/** A change to some fields; the route checks the rules between fields on the row as it will be. */
export const CutterTypeUpdateBody = CutterTypeFields.partial().extend({
  active: z.boolean({ error: 'must be true or false' }).optional(),
})

export const SupplierFields = z.object({
  name: Name,
  email: z.preprocess(blankToNull, Email.nullish()),
  phone: z.preprocess(blankToNull, z.string().trim().max(40, { error: 'use at most 40 characters' }).nullish()),
  leadTimeDays: Whole('the lead time in days', 0, 365).optional(),
  regrindTurnaroundDays: Whole('the regrind turnaround in days', 1, 365).optional(),
  note: z.string().trim().max(2000, { error: 'use at most 2000 characters' }).optional(),
})
export const SupplierBody = SupplierFields
export const SupplierUpdateBody = SupplierFields.partial().extend({
  active: z.boolean({ error: 'must be true or false' }).optional(),
})

export const ListQuery = z.object({
  /** Archived rows too (the catalogue page shows them on request). */
  archived: z.enum(['include', 'exclude']).default('exclude'),
})

/** CSV imports: at most 2 MB of text, checked before the body is read (413) and after. */
export const IMPORT_MAX_BYTES = 2 * 1024 * 1024
export const ImportBody = z.object({
  csv: z.string({ error: 'paste or upload a CSV' }).min(1, { error: 'paste or upload a CSV' }),
  dryRun: z.boolean({ error: 'must be true or false' }).optional(),
  filename: z.string().max(200).optional(),
})

export const CutLogExportQuery = z.object({
  from: Day.optional(),
  to: Day.optional(),
}).refine((q) => !q.from || !q.to || q.from <= q.to, { path: ['to'], error: 'must be on or after the from date' })
