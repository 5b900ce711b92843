// Resharpening (DESIGN.md computation 2, at the other end): what a cutter back from the
// regrinder becomes, reground or retired, and the plain words for why. Pure.
import type { RetireCause } from './due'

/** Diameters are stored to the thousandth of a millimetre (numeric(7,3)); decide on that value. */
export function roundMm(mm: number): number {
  return Math.round(mm * 1000) / 1000
}

/** The diameter one regrind is expected to leave, to prefill the receiving form. */
export function expectedDiameterMm(diameterMm: number, regrindDiameterLossMm: number): number {
  return roundMm(diameterMm - regrindDiameterLossMm)
}

export interface TypeForReceipt {
  maxRegrinds: number
  minUsableDiameterMm: number
}

export type ReceiptCause = 'undersize' | 'regrinds_exceeded'
export interface ReceiptVerdict {
  result: 'reground' | 'retired'
  cause: ReceiptCause | null
}

/** A cutter back from the regrinder goes back in the crib when its measured diameter is at
 *  least the type's minimum usable one (equal is usable) and this regrind stays within the
 *  type's maximum; otherwise it is retired instead. */
export function receiptVerdict(measuredDiameterMm: number, regrindCountBefore: number, type: TypeForReceipt): ReceiptVerdict {
  if (!(measuredDiameterMm > 0)) throw new RangeError('receiptVerdict needs a positive measured diameter')
  // Both sides are thousandths of a millimetre; the tolerance only absorbs floating-point noise.
  if (roundMm(measuredDiameterMm) < roundMm(type.minUsableDiameterMm) - 1e-9) return { result: 'retired', cause: 'undersize' }
  if (regrindCountBefore + 1 > type.maxRegrinds) return { result: 'retired', cause: 'regrinds_exceeded' }
  return { result: 'reground', cause: null }
}

/** The cutter's retired_reason for each cause: too small, or worn out after all its regrinds. */
export const RETIRED_REASON: Record<ReceiptCause, 'undersize' | 'worn'> = {
  undersize: 'undersize',
  regrinds_exceeded: 'worn',
}

/** Why a due cutter should be retired rather than resharpened, in plain words. */
export function retireSentence(cause: RetireCause, maxRegrinds: number): string {
  if (cause === 'regrinds_used_up') {
    return maxRegrinds === 0
      ? 'This type is not worth regrinding.'
      : `Its regrinds are used up (${maxRegrinds} of ${maxRegrinds}).`
  }
  return 'One more regrind would take it below the minimum usable diameter.'
}

/** What receiving will do to a cutter, in plain words. */
export function receiptSentence(verdict: ReceiptVerdict): string {
  if (verdict.cause === 'undersize') return 'Below the minimum usable diameter: it will be retired.'
  if (verdict.cause === 'regrinds_exceeded') return 'More regrinds than this type allows: it will be retired.'
  return 'Reground: back in the crib with a fresh life.'
}

/** A resharpening batch: drafted, sent out, received back, or cancelled before sending. */
export const BATCH_STATUSES = ['draft', 'sent', 'received', 'cancelled'] as const
export type BatchStatus = (typeof BATCH_STATUSES)[number]
export const BATCH_STATUS_LABELS: Record<BatchStatus, string> = {
  draft: 'Draft',
  sent: 'At the regrinder',
  received: 'Received back',
  cancelled: 'Cancelled',
}

/** The turnaround a supplier gets when none is set: about ten days there and back. */
export const DEFAULT_REGRIND_TURNAROUND_DAYS = 10
const DAY_MS = 86_400_000

export interface BatchAge {
  /** Whole days since the batch was sent. */
  ageDays: number
  expectedBackAt: Date
  overdue: boolean
  /** Whole days past the expected return (0 when not overdue). */
  daysOverdue: number
}

/** A sent batch's age against its supplier's turnaround: overdue once the expected day has passed. */
export function batchAge(sentAt: Date, turnaroundDays: number, now: Date): BatchAge {
  const expectedBackAt = new Date(sentAt.getTime() + turnaroundDays * DAY_MS)
  const late = now.getTime() - expectedBackAt.getTime()
  return {
    ageDays: Math.max(0, Math.floor((now.getTime() - sentAt.getTime()) / DAY_MS)),
    expectedBackAt,
    overdue: late > 0,
    daysOverdue: late > 0 ? Math.floor(late / DAY_MS) : 0,
  }
}
