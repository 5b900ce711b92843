// The label stock the label sheet prints on, in millimetres, and how labels fill its pages. Pure.
// Two thermal roll sizes (one label per printed page) and two office sheet layouts.
import { MM_PER_INCH } from './units'

export const LABEL_SIZE_KEYS = ['roll-50x25', 'roll-25x25', 'a4-24', 'letter-30'] as const
export type LabelSizeKey = (typeof LABEL_SIZE_KEYS)[number]

export interface LabelSize {
  key: LabelSizeKey
  name: string
  detail: string
  medium: 'roll' | 'sheet'
  pageMm: { width: number, height: number }
  labelMm: { width: number, height: number }
  columns: number
  rows: number
  /** Top-left corner of the first label on the page. */
  firstMm: { top: number, left: number }
  /** From one label's corner to the next one's, across and down. */
  pitchMm: { x: number, y: number }
  /** Side of the printed QR code with its quiet zone of four modules on every side (ISO/IEC 18004):
   *  at least 18 mm so that phone cameras read it from a bench. */
  qrMm: number
  /** The error-correction level of its code: M (about 15 % recoverable) where there is room; L
   *  (about 7 %) on the smallest label, where fewer modules keep each one large enough to print. */
  qrErrorCorrection: 'M' | 'L'
  /** `side`: QR left, text right. `square`: QR top left, code up the right edge, type text below. */
  layout: 'side' | 'square'
}

// Inch stock in mm.
const IN = MM_PER_INCH

export const LABEL_SIZES: Record<LabelSizeKey, LabelSize> = {
  // 2" x 1" direct-thermal roll label: the commonest desktop label printer size; wraps a bit's tube.
  'roll-50x25': {
    key: 'roll-50x25', name: '2" × 1" roll', detail: '50.8 × 25.4 mm thermal label', medium: 'roll',
    pageMm: { width: 2 * IN, height: IN }, labelMm: { width: 2 * IN, height: IN }, columns: 1, rows: 1,
    firstMm: { top: 0, left: 0 }, pitchMm: { x: 2 * IN, y: IN }, qrMm: 22, qrErrorCorrection: 'M', layout: 'side',
  },
  // 25 x 25 mm square thermal roll label: fits the flat of a tool holder or a bit box's end.
  'roll-25x25': {
    key: 'roll-25x25', name: '25 × 25 mm roll', detail: 'Square thermal label for holders', medium: 'roll',
    pageMm: { width: 25, height: 25 }, labelMm: { width: 25, height: 25 }, columns: 1, rows: 1,
    firstMm: { top: 0, left: 0 }, pitchMm: { x: 25, y: 25 }, qrMm: 18, qrErrorCorrection: 'L', layout: 'square',
  },
  // A4 sheet of 24 labels, 3 across by 8 down, 70 x 37 mm, edge to edge (0.5 mm top margin).
  'a4-24': {
    key: 'a4-24', name: 'A4 sheet of 24', detail: '70 × 37 mm, 3 across, 8 down', medium: 'sheet',
    pageMm: { width: 210, height: 297 }, labelMm: { width: 70, height: 37 }, columns: 3, rows: 8,
    firstMm: { top: 0.5, left: 0 }, pitchMm: { x: 70, y: 37 }, qrMm: 30, qrErrorCorrection: 'M', layout: 'side',
  },
  // US Letter sheet of 30 labels, 3 across by 10 down, 2-5/8" x 1": 1/2" top, 3/16" side
  // margins and 1/8" between columns.
  'letter-30': {
    key: 'letter-30', name: 'Letter sheet of 30', detail: '2-5/8" × 1", 3 across, 10 down', medium: 'sheet',
    pageMm: { width: 8.5 * IN, height: 11 * IN }, labelMm: { width: (21 / 8) * IN, height: IN }, columns: 3, rows: 10,
    firstMm: { top: 0.5 * IN, left: (3 / 16) * IN }, pitchMm: { x: (21 / 8 + 1 / 8) * IN, y: IN }, qrMm: 22, qrErrorCorrection: 'M', layout: 'side',
  },
}

export const DEFAULT_LABEL_SIZE: LabelSizeKey = 'roll-50x25'

export function isLabelSizeKey(key: unknown): key is LabelSizeKey {
  return typeof key === 'string' && (LABEL_SIZE_KEYS as readonly string[]).includes(key)
}

/** Top-left corner of the label at `slot` (0-based, across then down) on its page. */
export function slotPositionMm(size: LabelSize, slot: number): { top: number, left: number } {
  const column = slot % size.columns
  const row = Math.floor(slot / size.columns)
  return { top: size.firstMm.top + row * size.pitchMm.y, left: size.firstMm.left + column * size.pitchMm.x }
}

/**
 * Lays labels out on pages: each label `copies` times in a row, after `skip` slots left empty
 * (labels already peeled off a sheet that goes through the printer again). A slot is null when empty.
 */
export function paginateLabels<T>(labels: readonly T[], size: LabelSize, options: { copies?: number, skip?: number } = {}): Array<Array<T | null>> {
  const perPage = size.columns * size.rows
  const copies = Math.max(1, Math.floor(options.copies ?? 1))
  const skip = Math.min(perPage - 1, Math.max(0, Math.floor(options.skip ?? 0)))
  const slots: Array<T | null> = Array.from({ length: skip }, () => null)
  for (const label of labels) for (let i = 0; i < copies; i++) slots.push(label)
  if (!labels.length) return []
  const pages: Array<Array<T | null>> = []
  for (let i = 0; i < slots.length; i += perPage) pages.push(slots.slice(i, i + perPage))
  return pages
}

/** The quiet zone ISO/IEC 18004 asks for around a QR code, in modules, on every side. */
export const QR_QUIET_MODULES = 4
/** The smallest type on a label: 6 pt, at 25.4 / 72 mm a point. */
export const MIN_TEXT_MM = (6 * 25.4) / 72
