// The spindle's fixed lists and limits, kept free of zod so the phone pages that need them
// do not carry the validation library. shared/schemas/spindle.ts builds its schemas on these. Pure.
export const CUT_OUTCOMES = ['clean', 'melted', 'chip_out', 'fuzzy', 'broken'] as const
export type CutOutcome = (typeof CUT_OUTCOMES)[number]

export const FLAG_KINDS = ['dull', 'broken'] as const
export type FlagKind = (typeof FLAG_KINDS)[number]

/** The largest photo a flag may carry. */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024
