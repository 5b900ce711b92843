// The phone's cut form as text fields: what it refuses before sending (with CUT_LIMITS, the same
// limits as the server's CutLogBody), and the body it sends. Kept out of the component so a
// property test can hold the two checks to each other. Pure.
import { CUT_LIMITS, type CutOutcome } from './spindle'

export interface CutFormFields {
  minutes: string
  materialId: number | null
  outcome: CutOutcome | null
  rpm: string
  /** Always mm per minute (the form shows the inch figure beside it). */
  feed: string
  note: string
  /** Cleanup minutes per part, optional. */
  cleanup?: string
}

/** A typed number: empty is null, a decimal comma is a point. */
export const parseFormNumber = (text: string) => (text.trim() === '' ? null : Number(text.trim().replace(',', '.')))

const { minutes: MINUTES, rpm: RPM, feedMmPerMin: FEED, cleanupMinutesPerPart: CLEANUP, noteChars: NOTE } = CUT_LIMITS

/** The form's own check: a message per field it refuses, none when it may be sent. */
export function cutFormProblems(f: CutFormFields): Record<string, string> {
  const found: Record<string, string> = {}
  const m = parseFormNumber(f.minutes)
  if (m === null || !Number.isFinite(m) || m < MINUTES.min || m > MINUTES.max) {
    found.minutes = `Enter the minutes cut: at least ${MINUTES.min}, at most ${MINUTES.max} (a day).`
  }
  if (f.materialId === null) found.materialId = 'Choose the material that was cut.'
  if (!f.outcome) found.outcome = 'Choose how the cut went.'
  const r = parseFormNumber(f.rpm)
  if (r !== null && !(Number.isInteger(r) && r > 0 && r <= RPM.max)) {
    found.rpm = `Spindle speed is a whole number of rpm up to ${RPM.max.toLocaleString('en-US')}, or leave it empty.`
  }
  const feed = parseFormNumber(f.feed)
  if (feed !== null && !(Number.isFinite(feed) && feed >= FEED.min && feed <= FEED.max)) {
    found.feedMmPerMin = `Feed is a number of mm per minute from ${FEED.min} to ${FEED.max.toLocaleString('en-US')}, or leave it empty.`
  }
  const cleanup = parseFormNumber(f.cleanup ?? '')
  if (cleanup !== null && !(Number.isFinite(cleanup) && cleanup >= CLEANUP.min && cleanup <= CLEANUP.max)) {
    found.cleanupMinutesPerPart = `Cleanup is minutes per part, ${CLEANUP.min} to ${CLEANUP.max}, or leave it empty.`
  }
  const note = f.note.trim()
  if (note.length > NOTE) found.note = `The note is ${note.length} characters; keep it to ${NOTE}.`
  return found
}

/** The body of POST /api/cutters/:id/cuts from fields that passed `cutFormProblems`. */
export function cutFormBody(f: CutFormFields, extra: { idempotencyKey: string, machineId?: number, cutAt: string }) {
  const rpm = parseFormNumber(f.rpm)
  const feed = parseFormNumber(f.feed)
  const cleanup = parseFormNumber(f.cleanup ?? '')
  const note = f.note.trim()
  return {
    idempotencyKey: extra.idempotencyKey,
    materialId: f.materialId!,
    minutes: parseFormNumber(f.minutes)!,
    outcome: f.outcome!,
    ...(rpm ? { rpm } : {}),
    ...(feed ? { feedMmPerMin: feed } : {}),
    ...(cleanup !== null ? { cleanupMinutesPerPart: cleanup } : {}),
    ...(note ? { note } : {}),
    ...(extra.machineId !== undefined ? { machineId: extra.machineId } : {}),
    cutAt: extra.cutAt,
  }
}
