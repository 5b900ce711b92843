// Input of the bit chooser (GET /api/bit-choice), shared with its page and the phone panel.
import { z } from 'zod'
import { CUT_KINDS } from '../kerf/bit-choice'

const MAX_ID = 2_147_483_647
// Query strings arrive as text, and a blank one means "not given".
const blank = (v: unknown) => (v === '' || v === null ? undefined : v)
const id = (what: string) => z.coerce.number({ error: `choose a ${what}` }).int({ error: `choose a ${what}` }).positive({ error: `choose a ${what}` }).max(MAX_ID)
/** Sheets a router cuts: more than 0 and at most 300 mm. */
export const MAX_THICKNESS_MM = 300
const mm = (what: string) => z.coerce.number({ error: `enter the ${what} in mm` })
  .gt(0, { error: 'must be more than 0 mm' }).max(MAX_THICKNESS_MM, { error: `must be at most ${MAX_THICKNESS_MM} mm` })

export const BitChoiceQuery = z.object({
  materialId: id('material'),
  cut: z.enum(CUT_KINDS, { error: 'choose profile, pocket, slot, engrave, drill or surface_3d' }),
  thicknessMm: z.preprocess(blank, mm('thickness').optional()),
  machineId: z.preprocess(blank, id('machine').optional()),
  // The narrowest slot or gap the bit must fit, when the job has one.
  narrowestMm: z.preprocess(blank, mm('narrowest feature').optional()),
})
export type BitChoiceQueryInput = z.input<typeof BitChoiceQuery>
