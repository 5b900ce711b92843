// The spindle's fixed lists and limits, kept free of zod so the phone pages that need them
// do not carry the validation library. shared/schemas/spindle.ts builds its schemas on these. Pure.
export const CUT_OUTCOMES = ['clean', 'melted', 'chip_out', 'fuzzy', 'broken'] as const
export type CutOutcome = (typeof CUT_OUTCOMES)[number]

/**
 * What a cut log accepts, for the server's schema and the phone's form alike. Minutes are stored
 * to 0.01 (anything shorter rounds to 0) and one log covers at most a day; the rest are the
 * widest figures a router could give, and the note's length.
 */
export const CUT_LIMITS = {
  minutes: { min: 0.01, max: 1440 },
  rpm: { max: 100_000 },
  feedMmPerMin: { min: 0.01, max: 1_000_000 },
  cleanupMinutesPerPart: { min: 0, max: 600 },
  noteChars: 2000,
} as const

export const FLAG_KINDS = ['dull', 'broken'] as const
export type FlagKind = (typeof FLAG_KINDS)[number]

/** The largest photo a flag may carry. */
export const PHOTO_MAX_BYTES = 8 * 1024 * 1024
