// Cutter statuses and the words shown for them. Pure.
export const CUTTER_STATUSES = ['in_crib', 'in_spindle', 'at_regrind', 'retired', 'lost'] as const
export type CutterStatus = (typeof CUTTER_STATUSES)[number]

export const STATUS_LABELS: Record<CutterStatus, string> = {
  in_crib: 'In the crib',
  in_spindle: 'In a spindle',
  at_regrind: 'Out for regrind',
  retired: 'Retired',
  lost: 'Lost',
}
