// Inputs of the NC program routes, shared with the program pages' forms.
import { z } from 'zod'
import { CUT_LIMITS, CUT_OUTCOMES } from '../kerf/spindle'

const MAX_ID = 2_147_483_647
/** Programs larger than this are refused before they are read. */
export const PROGRAM_MAX_BYTES = 20 * 1024 * 1024

const id = (what: string) => z.coerce.number({ error: `choose a ${what}` }).int({ error: `choose a ${what}` }).positive({ error: `choose a ${what}` }).max(MAX_ID, { error: `choose a ${what}` })
const toolNumber = z.coerce.number({ error: 'must be a tool number' }).int({ error: 'must be a whole number' }).min(0, { error: 'must be 0 to 9999' }).max(9999, { error: 'must be 0 to 9999' })

export const ProgramIdParams = z.object({ id: id('program') })

/** The text fields sent with the file. */
export const ProgramFields = z.object({
  name: z.string().trim().min(1, { error: 'give the program a name' }).max(200, { error: 'use at most 200 characters' }).optional(),
  /** The tool already in the spindle, for a program that cuts before its first tool change. */
  spindleTool: z.preprocess((v) => (v === '' ? undefined : v), toolNumber.optional()),
})

export const CheckQuery = z.object({
  machineId: id('machine'),
  materialId: id('material'),
  repeats: z.coerce.number({ error: 'enter the number of sheets or repeats' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 to 1000' }).max(1000, { error: 'must be 1 to 1000' }).default(1),
})

export const RunBody = z.object({
  machineId: z.number({ error: 'choose a machine' }).int().positive().max(MAX_ID),
  materialId: z.number({ error: 'choose a material' }).int().positive().max(MAX_ID),
  repeats: z.number({ error: 'enter the number of sheets or repeats' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 to 1000' }).max(1000, { error: 'must be 1 to 1000' }),
  jobRef: z.string().trim().max(100, { error: 'use at most 100 characters' }).optional(),
  idempotencyKey: z.string().min(8, { error: 'must be 8 to 80 characters' }).max(80, { error: 'must be 8 to 80 characters' }),
  adjust: z.array(z.object({
    tool: toolNumber,
    minutes: z.number({ error: 'enter the minutes' }).min(0.01, { error: 'must be at least 0.01 minutes' }).max(1440, { error: 'must be at most 1440 minutes' }).optional(),
    outcome: z.enum(CUT_OUTCOMES, { error: 'choose clean, melted, chip out, fuzzy or broken' }).optional(),
    // Hand-finishing each part needed because of this tool's edge, carried to its cut log.
    cleanupMinutesPerPart: z.number({ error: 'enter the cleanup minutes per part' })
      .min(CUT_LIMITS.cleanupMinutesPerPart.min, { error: 'must be 0 or more' })
      .max(CUT_LIMITS.cleanupMinutesPerPart.max, { error: `must be at most ${CUT_LIMITS.cleanupMinutesPerPart.max} minutes` }).nullish(),
  })).max(100).optional(),
})
export type RunInput = z.input<typeof RunBody>

export const ToolMapBody = z.object({
  map: z.array(z.object({
    tool: toolNumber,
    pocket: z.number({ error: 'must be a pocket number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 to 99' }).max(99, { error: 'must be 1 to 99' }),
  })).max(200),
})
