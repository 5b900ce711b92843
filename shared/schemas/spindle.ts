// Inputs of the spindle routes, shared with the phone page's forms.
import { z } from 'zod'
import { CUT_OUTCOMES, FLAG_KINDS, PHOTO_MAX_BYTES } from '../kerf/spindle'
import { EARLIEST_YEAR } from './dates'

export { CUT_OUTCOMES, FLAG_KINDS, PHOTO_MAX_BYTES }
export type { CutOutcome } from '../kerf/spindle'

// Ids are PostgreSQL integers: a larger number must be refused here, not fail in the database.
const MAX_ID = 2_147_483_647

export const CutterIdParams = z.object({ id: z.coerce.number().int().positive().max(MAX_ID) })

export const LoadBody = z.object({
  machineId: z.number({ error: 'choose a machine' }).int().positive().max(MAX_ID),
  /** The bit seen in a one-bit machine, to go back to the crib in the same step ("return that one and load this"). */
  returnCutterId: z.number({ error: 'must be a cutter id' }).int().positive().max(MAX_ID).optional(),
})

export const CutLogBody = z.object({
  idempotencyKey: z.string().min(8, { error: 'must be 8 to 100 characters' }).max(100, { error: 'must be 8 to 100 characters' }),
  materialId: z.number({ error: 'choose a material' }).int().positive().max(MAX_ID),
  minutes: z.number({ error: 'enter the minutes cut' })
    // Stored to 0.01 minute: anything shorter would round to 0 in the database.
    .min(0.01, { error: 'must be at least 0.01 minutes' })
    .max(1440, { error: 'must be at most 24 hours (1440 minutes)' }),
  outcome: z.enum(CUT_OUTCOMES, { error: 'choose clean, melted, chip out, fuzzy or broken' }),
  rpm: z.number().int({ error: 'must be a whole number' }).positive({ error: 'must be more than 0' }).max(100_000).nullish(),
  feedMmPerMin: z.number().min(0.01, { error: 'must be at least 0.01 mm/min' }).max(1_000_000).nullish(),
  note: z.string().trim().max(2000, { error: 'use at most 2000 characters' }).optional(),
  machineId: z.number().int().positive().max(MAX_ID).nullish(),
  // When the cut finished; a log sent late from the phone's queue keeps its real time.
  cutAt: z.iso.datetime({ offset: true, error: 'must be an ISO date and time' })
    .refine((s) => Number(s.slice(0, 4)) >= EARLIEST_YEAR, { error: `must be in ${EARLIEST_YEAR} or later` }).optional(),
})
export type CutLogInput = z.input<typeof CutLogBody>

export const FlagFields = z.object({
  kind: z.enum(FLAG_KINDS, { error: 'choose dull or broken' }),
  note: z.string().trim().max(2000, { error: 'use at most 2000 characters' }).optional(),
})

/** Cut-log ids are PostgreSQL bigints; the app's own stay far below 2^53. */
export const CutLogIdParams = z.object({ id: z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER) })

const Reason = z.string({ error: 'say why, for whoever reads the history' }).trim()
  .min(1, { error: 'say why, for whoever reads the history' }).max(500, { error: 'use at most 500 characters' })

export const CutLogCorrectionBody = z.object({
  minutes: CutLogBody.shape.minutes.optional(),
  materialId: CutLogBody.shape.materialId.optional(),
  outcome: CutLogBody.shape.outcome.optional(),
  note: z.string().trim().max(2000, { error: 'use at most 2000 characters' }).optional(),
  reason: Reason,
}).refine((b) => b.minutes !== undefined || b.materialId !== undefined || b.outcome !== undefined || b.note !== undefined,
  { error: 'change at least one of minutes, material, outcome or note', path: ['minutes'] })
export type CutLogCorrectionInput = z.input<typeof CutLogCorrectionBody>

export const CutLogVoidBody = z.object({ reason: Reason })
