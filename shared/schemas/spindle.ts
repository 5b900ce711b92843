// Inputs of the spindle routes, shared with the phone page's forms.
import { z } from 'zod'
import { OUTCOME_LABELS } from '../kerf/history-words'
import { CUT_LIMITS, CUT_OUTCOMES, FLAG_KINDS, PHOTO_MAX_BYTES } from '../kerf/spindle'
import { EARLIEST_YEAR } from './dates'

export { CUT_OUTCOMES, FLAG_KINDS, PHOTO_MAX_BYTES }
export type { CutOutcome } from '../kerf/spindle'

// Ids are PostgreSQL integers: a larger number must be refused here, not fail in the database.
const MAX_ID = 2_147_483_647

const { minutes: MINUTES, feedMmPerMin: FEED } = CUT_LIMITS
const NOTE_ERROR = `use at most ${CUT_LIMITS.noteChars} characters`
const outcomeWords = CUT_OUTCOMES.map((o) => OUTCOME_LABELS[o].toLowerCase())

export const CutterIdParams = z.object({ id: z.coerce.number().int().positive().max(MAX_ID) })

/** The phone's key for one action, the same on every attempt, so that the server does it once. */
const IdempotencyKey = z.string().min(8, { error: 'must be 8 to 100 characters' }).max(100, { error: 'must be 8 to 100 characters' })

export const LoadBody = z.object({
  machineId: z.number({ error: 'choose a machine' }).int().positive().max(MAX_ID),
  idempotencyKey: IdempotencyKey.optional(),
  /** The bit seen in a one-bit machine, to go back to the crib in the same step ("return that one and load this"). */
  returnCutterId: z.number({ error: 'must be a cutter id' }).int().positive().max(MAX_ID).optional(),
  /** The tool-changer pocket, for a machine with pockets (the lowest free one when not given). */
  pocket: z.number({ error: 'must be a pocket number' }).int({ error: 'must be a whole number' }).min(1, { error: 'must be 1 to 99' }).max(99, { error: 'must be 1 to 99' }).optional(),
})

/** Returning needs nothing but, from the phone's queue, its key. */
export const ReturnBody = z.object({ idempotencyKey: IdempotencyKey.optional() }).optional()

export const CutLogBody = z.object({
  idempotencyKey: IdempotencyKey,
  materialId: z.number({ error: 'choose a material' }).int().positive().max(MAX_ID),
  minutes: z.number({ error: 'enter the minutes cut' })
    // Stored to 0.01 minute: anything shorter would round to 0 in the database.
    .min(MINUTES.min, { error: `must be at least ${MINUTES.min} minutes` })
    .max(MINUTES.max, { error: `must be at most 24 hours (${MINUTES.max} minutes)` }),
  outcome: z.enum(CUT_OUTCOMES, { error: `choose ${outcomeWords.slice(0, -1).join(', ')} or ${outcomeWords.at(-1)}` }),
  rpm: z.number().int({ error: 'must be a whole number' }).positive({ error: 'must be more than 0' }).max(CUT_LIMITS.rpm.max).nullish(),
  feedMmPerMin: z.number().min(FEED.min, { error: `must be at least ${FEED.min} mm/min` }).max(FEED.max).nullish(),
  // Hand-finishing a part needed because of the edge (fuzz, melt, chip-out), in minutes.
  cleanupMinutesPerPart: z.number({ error: 'enter the cleanup minutes per part' })
    .min(0, { error: 'must be 0 or more' }).max(CUT_LIMITS.cleanupMinutesPerPart.max, { error: `must be at most ${CUT_LIMITS.cleanupMinutesPerPart.max} minutes` }).nullish(),
  note: z.string().trim().max(CUT_LIMITS.noteChars, { error: NOTE_ERROR }).optional(),
  machineId: z.number().int().positive().max(MAX_ID).nullish(),
  // When the cut finished; a log sent late from the phone's queue keeps its real time.
  cutAt: z.iso.datetime({ offset: true, error: 'must be an ISO date and time' })
    .refine((s) => Number(s.slice(0, 4)) >= EARLIEST_YEAR, { error: `must be in ${EARLIEST_YEAR} or later` }).optional(),
})
export type CutLogInput = z.input<typeof CutLogBody>

export const FlagFields = z.object({
  kind: z.enum(FLAG_KINDS, { error: 'choose dull or broken' }),
  note: z.string().trim().max(CUT_LIMITS.noteChars, { error: NOTE_ERROR }).optional(),
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
