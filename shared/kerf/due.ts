// Which cutters need the crib's attention, and whether to resharpen or retire them.
// Pure: no framework or database imports.

export type DueReason = 'life_used' | 'flagged_dull'
export type DueAction = 'resharpen' | 'retire'

export interface CutterForDue {
  status: string
  lifeUsed: number
  flagged: 'dull' | 'broken' | null
  regrindCount: number
  diameterMm: number
}

export interface TypeForDue {
  maxRegrinds: number
  regrindDiameterLossMm: number
  minUsableDiameterMm: number
}

/** The resharpen threshold of a new shop (the shops table's default): due at 90 % of a sharp life. */
export const DEFAULT_LIFE_THRESHOLD = 0.9

/** Statuses in which a cutter can be due: it is in the shop and in use. */
export const DUE_STATUSES = ['in_crib', 'in_spindle'] as const

/** Why the cutter is due, or null when it is not. A flag beats the figure: the operator saw it. */
export function dueReason(cutter: CutterForDue, lifeThreshold: number): DueReason | null {
  if (!(DUE_STATUSES as readonly string[]).includes(cutter.status)) return null
  if (cutter.flagged === 'dull') return 'flagged_dull'
  if (cutter.lifeUsed >= lifeThreshold) return 'life_used'
  return null
}

/** Why one more regrind is not allowed ('regrinds_used_up' or 'too_small'), or null when it is. */
export type RetireCause = 'regrinds_used_up' | 'too_small'
export function retireCause(cutter: CutterForDue, type: TypeForDue): RetireCause | null {
  if (cutter.regrindCount >= type.maxRegrinds) return 'regrinds_used_up'
  const diameterAfter = cutter.diameterMm - type.regrindDiameterLossMm
  if (diameterAfter < type.minUsableDiameterMm - 1e-9) return 'too_small'
  return null
}

/** Resharpen while another regrind is allowed and leaves the diameter usable; otherwise retire. */
export function dueAction(cutter: CutterForDue, type: TypeForDue): DueAction {
  return retireCause(cutter, type) ? 'retire' : 'resharpen'
}
