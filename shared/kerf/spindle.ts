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

/** What a new cut log's minutes are weighed against: the shop's shift, and this type's longest logged cut. */
export interface UsualMinutes { shiftMinutes: number, longestCutMinutes: number | null }

/** How many times the type's longest logged cut a new one may be before the form asks (common practice, no source). */
export const UNUSUAL_MULTIPLE = 4

/**
 * Why these minutes are far from usual, in a sentence, or null when they are not: more than the
 * shop's shift, or more than four times the longest cut logged on this type. A slip of the thumb
 * (600 for 60) would otherwise use up a cutter's life in one log.
 */
export function unusualMinutes(minutes: number, usual: UsualMinutes): string | null {
  const hours = (m: number) => `${Number((m / 60).toFixed(1))} h`
  if (minutes > usual.shiftMinutes) return `That is longer than the shop's shift of ${hours(usual.shiftMinutes)}.`
  const longest = usual.longestCutMinutes
  if (longest && longest > 0 && minutes > UNUSUAL_MULTIPLE * longest) {
    return `That is more than ${UNUSUAL_MULTIPLE} times the longest cut logged on this type of bit (${Number(longest.toFixed(1))} min).`
  }
  return null
}
