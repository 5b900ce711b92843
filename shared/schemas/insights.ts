// Inputs of the insights routes: a range of UTC days, what to group cost by, and adopting
// learned wear factors.
import { z } from 'zod'
import { Day } from './dates'

const rangeFields = { from: Day.optional(), to: Day.optional() }
const ordered = (q: { from?: string, to?: string }) => !q.from || !q.to || q.from <= q.to
const orderMessage = { path: ['to'], error: 'must be on or after the from date' }

export const InsightsRangeQuery = z.object(rangeFields).refine(ordered, orderMessage)

export const COST_GROUPS = ['material', 'machine', 'operator', 'type'] as const
export type CostGroup = (typeof COST_GROUPS)[number]

export const CostQuery = z.object({
  ...rangeFields,
  by: z.enum(COST_GROUPS, { error: 'choose material, machine, operator or type' }).default('material'),
}).refine(ordered, orderMessage)

export const AdoptWearBody = z.object({
  ...rangeFields,
  materialIds: z.array(z.number({ error: 'must be a material id' }).int().positive().max(2_147_483_647), { error: 'choose the materials to adopt' })
    .min(1, { error: 'choose at least one material' })
    .max(500, { error: 'choose at most 500 materials' }),
  /** Adopt figures whose 90 % interval is wide as well (the page asks the person first). */
  confirmWide: z.boolean({ error: 'must be true or false' }).optional(),
}).refine(ordered, orderMessage)
