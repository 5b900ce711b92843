// The words of a cutter's history: what each event kind means, and the outcome of a cut. Pure.
import type { CutOutcome } from './spindle'

export type { CutOutcome }
export type CutterEventKind = 'received' | 'loaded' | 'returned' | 'cut_logged' | 'flagged_dull' | 'flagged_broken'
  | 'sent_to_regrind' | 'reground' | 'retired' | 'lost' | 'found' | 'edited' | 'cut_corrected' | 'cut_voided'

export const EVENT_LABELS: Record<CutterEventKind, string> = {
  received: 'Received into the crib',
  loaded: 'Loaded',
  returned: 'Returned to the crib',
  cut_logged: 'Cut logged',
  flagged_dull: 'Flagged dull',
  flagged_broken: 'Flagged broken',
  sent_to_regrind: 'Sent for resharpening',
  reground: 'Resharpened',
  retired: 'Retired',
  lost: 'Marked lost',
  found: 'Found',
  edited: 'Changed',
  cut_corrected: 'Cut log corrected',
  cut_voided: 'Cut log voided',
}

export const OUTCOME_LABELS: Record<CutOutcome, string> = {
  clean: 'Clean',
  melted: 'Melted',
  chip_out: 'Chip-out',
  fuzzy: 'Fuzzy',
  broken: 'Broken',
}

/** "Loaded into Big table" where the machine is known; the plain label otherwise. */
export function eventTitle(kind: CutterEventKind, machineName: string | null): string {
  if (kind === 'loaded' && machineName) return `Loaded into ${machineName}`
  if (kind === 'returned' && machineName) return `Returned to the crib from ${machineName}`
  return EVENT_LABELS[kind]
}

