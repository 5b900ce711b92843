// Inputs of the feeds-and-speeds routes and the chip-load table, shared with their pages.
import { z } from 'zod'

const MAX_ID = 2_147_483_647
// Query strings arrive as text, and a blank one means "not given".
const blank = (v: unknown) => (v === '' || v === null ? undefined : v)
const id = (what: string) => z.coerce.number({ error: `choose a ${what}` }).int({ error: `choose a ${what}` }).positive({ error: `choose a ${what}` }).max(MAX_ID)

export const FeedsQuery = z.object({
  typeId: id('cutter type'),
  materialId: id('material'),
  machineId: id('machine'),
  // The cutter itself, when known: its measured diameter and life used count.
  cutterId: z.preprocess(blank, id('cutter').optional()),
  // How deep the bit cuts, in mm: the chip load is reduced from twice the diameter.
  depthMm: z.preprocess(blank, z.coerce.number({ error: 'enter the depth of cut in mm' })
    .positive({ error: 'must be more than 0' }).max(500, { error: 'must be at most 500 mm' }).optional()),
})
export type FeedsQueryInput = z.input<typeof FeedsQuery>

export const ChipLoadIdParams = z.object({ id: z.coerce.number().int().positive().max(MAX_ID) })

// The smallest steps the table stores (numeric scales); anything finer would round to zero.
const chip = z.number({ error: 'enter a chip load in mm per tooth' })
  .min(0.0001, { error: 'must be at least 0.0001 mm' }).max(5, { error: 'must be at most 5 mm' })
const optional = (schema: z.ZodNumber) => schema.nullable().optional()

/** A change to one row; band edges stay as they are so that the bands never overlap. */
export const ChipLoadPatchBody = z.object({
  chipLoadMinMm: chip.optional(),
  chipLoadMaxMm: chip.optional(),
  surfaceSpeedMPerMin: optional(z.number().min(0.01, { error: 'must be more than 0' }).max(5000, { error: 'must be at most 5000 m/min' })),
  plungeFraction: optional(z.number().min(0.001, { error: 'must be at least 0.1 %' }).max(1, { error: 'must be at most 100 %' })),
  depthPerPassFactor: optional(z.number().min(0.001, { error: 'must be more than 0' }).max(10, { error: 'must be at most 10 times the diameter' })),
  source: z.string().trim().min(1, { error: 'say where the figures come from' }).max(300, { error: 'use at most 300 characters' }).optional(),
})
export type ChipLoadPatchInput = z.input<typeof ChipLoadPatchBody>
