// The label sheet's query: which cutters to label, by id list, by type or by purchase order.
import { z } from 'zod'

/** At most this many labels on one sheet. */
export const MAX_LABELS = 500

const SELECTORS = ['ids', 'typeId', 'orderId'] as const
// Ids are PostgreSQL integers: a larger number would fail in the database rather than here.
const IdNumber = z.number().int('Give a whole number.').positive('Give a number above 0.').max(2 ** 31 - 1, 'That number is too large.')
const Id = z.coerce.number({ error: 'Give a whole number.' }).pipe(IdNumber)
const IdList = z.preprocess(
  (v) => (Array.isArray(v) ? v.join(',') : v),
  z.string().regex(/^\s*\d+\s*(,\s*\d+\s*)*$/, 'Give cutter ids as numbers separated by commas, for example 12,15,31.'),
).transform((s) => [...new Set(s.split(',').map((part) => Number(part.trim())))])
  .pipe(z.array(IdNumber).max(MAX_LABELS, `Print at most ${MAX_LABELS} labels at a time.`))

export const LabelsQuery = z.object({ ids: IdList.optional(), typeId: Id.optional(), orderId: Id.optional() })
  .superRefine((q, ctx) => {
    const given = SELECTORS.filter((key) => q[key] !== undefined)
    if (!given.length) ctx.addIssue({ code: 'custom', path: [], message: 'Say which cutters to label: give ids, typeId or orderId.' })
    for (const extra of given.slice(1)) {
      ctx.addIssue({ code: 'custom', path: [extra], message: `Give only one of ids, typeId or orderId, not ${given[0]} as well.` })
    }
  })
