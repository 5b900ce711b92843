// Inputs of the resharpening routes, shared with the crib's resharpening page.
import { z } from 'zod'

const MAX_ID = 2_147_483_647
const id = (what: string) => z.number({ error: `choose a ${what}` }).int().positive().max(MAX_ID)
// A batch is a box of bits sent out together; a few hundred is far beyond any shop's run.
const cutterIds = z.array(id('cutter'), { error: 'list the cutters by id' })
  .max(500, { error: 'use at most 500 cutters in one batch' })
  .transform((ids) => [...new Set(ids)])
const note = z.string().trim().max(2000, { error: 'use at most 2000 characters' })

export const BatchIdParams = z.object({ id: z.coerce.number().int().positive().max(MAX_ID) })

export const CreateBatchBody = z.object({
  cutterIds: cutterIds.refine((ids) => ids.length > 0, { error: 'choose at least one cutter' }),
  supplierId: id('supplier').nullish(),
  note: note.optional(),
})
export type CreateBatchInput = z.input<typeof CreateBatchBody>

export const EditBatchBody = z.object({
  addCutterIds: cutterIds.optional(),
  removeCutterIds: cutterIds.optional(),
  supplierId: id('supplier').nullish(),
  note: note.optional(),
})

export const SendBatchBody = z.object({
  // E-mail the list to the supplier; only when the supplier has an address.
  emailSupplier: z.boolean().optional(),
})

// Each bit that came back with its measured diameter, or one the regrinder scrapped with the
// reason it gave; the bits not listed stay out.
export const ReceiveItem = z.object({
  cutterId: id('cutter'),
  diameterMm: z.number({ error: 'enter the measured diameter' })
    .min(0.001, { error: 'must be at least 0.001 mm' })
    .max(1000, { error: 'must be at most 1000 mm' }).optional(),
  scrapReason: z.string({ error: 'say why the regrinder scrapped it' }).trim()
    .min(1, { error: 'say why the regrinder scrapped it' }).max(500, { error: 'use at most 500 characters' }).optional(),
  costCents: z.number({ error: 'enter the cost' }).int({ error: 'must be whole cents' })
    .min(0, { error: 'cannot be negative' }).max(10_000_000, { error: 'must be at most 100,000.00' }).optional(),
}).superRefine((item, ctx) => {
  if (item.diameterMm === undefined && item.scrapReason === undefined) {
    ctx.addIssue({ code: 'custom', path: ['diameterMm'], message: 'enter the measured diameter, or the reason it was scrapped' })
  }
  if (item.diameterMm !== undefined && item.scrapReason !== undefined) {
    ctx.addIssue({ code: 'custom', path: ['scrapReason'], message: 'a bit that came back with a diameter was not scrapped: give one or the other' })
  }
})

export const ReceiveBatchBody = z.object({
  items: z.array(ReceiveItem, { error: 'list the cutters that came back, each with its measured diameter' })
    .min(1, { error: 'list at least one cutter that came back or was scrapped' })
    .max(500, { error: 'use at most 500 cutters in one batch' }),
})
export type ReceiveBatchInput = z.input<typeof ReceiveBatchBody>
