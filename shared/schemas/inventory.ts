// Inputs of the crib's inventory: the list's filters, sorting and paging, and the row actions.
// Shared by the routes and the inventory page, which keeps the same query in its URL.
import { z } from 'zod'
import { CUTTER_STATUSES, type CutterStatus } from '../kerf/status'

export const INVENTORY_SORTS = ['code', 'type', 'status', 'machine', 'lifeUsed', 'minutesTotal', 'regrindCount',
  'diameterMm', 'receivedAt', 'updatedAt'] as const
export type InventorySortField = (typeof INVENTORY_SORTS)[number]
export const INVENTORY_PAGE_SIZE = 50
export const INVENTORY_MAX_PAGE_SIZE = 200

// A query string gives '' for a field left blank in a form and an array for a repeated one.
const blank = (v: unknown) => (v === '' || v === null ? undefined : v)
const id = (what: string) => z.preprocess(blank, z.coerce.number({ error: `must be the id of a ${what}` })
  .int({ error: `must be the id of a ${what}` }).positive({ error: `must be the id of a ${what}` }).max(2_147_483_647).optional())
const fraction = z.preprocess(blank, z.coerce.number({ error: 'must be a fraction such as 0.5' })
  .min(0, { error: 'must be 0 or more' }).max(100, { error: 'must be at most 100' }).optional())

const statusList = z.preprocess(
  (v) => (Array.isArray(v) ? v.join(',') : blank(v)),
  z.string().max(200).transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean))
    // Checked as a whole so that the error names the field, not an index in the list.
    .refine((list) => list.every((s) => (CUTTER_STATUSES as readonly string[]).includes(s)), {
      error: `use ${CUTTER_STATUSES.join(', ')}, or several separated by commas`,
    })
    .transform((list) => list as CutterStatus[])
    .optional(),
)

const sort = z.preprocess(blank, z.string()
  .regex(new RegExp(`^-?(${INVENTORY_SORTS.join('|')})$`), {
    error: `sort by one of ${INVENTORY_SORTS.join(', ')}; put - in front for descending`,
  })
  .default('code')
  .transform((s) => ({ field: s.replace(/^-/, '') as InventorySortField, desc: s.startsWith('-') })))

export const InventoryQuery = z.object({
  status: statusList,
  typeId: id('cutter type'),
  machineId: id('machine'),
  // A label code's start or a part of the type's name.
  q: z.preprocess(blank, z.string().trim().max(60, { error: 'use at most 60 characters' }).optional()),
  // Life used as a fraction: lifeMin inclusive, lifeMax exclusive, so bands such as 0.5-0.9 and 0.9- do not overlap.
  lifeMin: fraction,
  lifeMax: fraction,
  due: z.preprocess(blank, z.stringbool({ error: 'must be true or false' }).optional()),
  sort,
  page: z.preprocess(blank, z.coerce.number({ error: 'must be a whole number from 1' })
    .int({ error: 'must be a whole number from 1' }).min(1, { error: 'must be a whole number from 1' }).max(1_000_000).default(1)),
  pageSize: z.preprocess(blank, z.coerce.number({ error: `must be a whole number from 1 to ${INVENTORY_MAX_PAGE_SIZE}` })
    .int({ error: `must be a whole number from 1 to ${INVENTORY_MAX_PAGE_SIZE}` })
    .min(1, { error: `must be a whole number from 1 to ${INVENTORY_MAX_PAGE_SIZE}` })
    .max(INVENTORY_MAX_PAGE_SIZE, { error: `must be at most ${INVENTORY_MAX_PAGE_SIZE}` })
    .default(INVENTORY_PAGE_SIZE)),
}).refine((q) => q.lifeMin === undefined || q.lifeMax === undefined || q.lifeMin < q.lifeMax, {
  path: ['lifeMax'], error: 'must be more than lifeMin',
})
export type InventoryQueryInput = z.input<typeof InventoryQuery>
export type InventoryFilter = z.output<typeof InventoryQuery>

export const HISTORY_PAGE_SIZE = 100
export const HistoryQuery = z.object({
  page: z.preprocess(blank, z.coerce.number().int().min(1, { error: 'must be a whole number from 1' }).max(100_000).default(1)),
  pageSize: z.preprocess(blank, z.coerce.number().int().min(1).max(500, { error: 'must be at most 500' }).default(HISTORY_PAGE_SIZE)),
})

const Note = z.string().trim().max(2000, { error: 'use at most 2000 characters' }).optional()

/** Lost, found and clearing a flag take an optional note. */
export const NoteBody = z.preprocess((v) => v ?? {}, z.object({ note: Note }))

export const RETIRE_REASONS = ['worn', 'other'] as const
export const RetireBody = z.object({
  reason: z.enum(RETIRE_REASONS, { error: 'choose worn or other' }),
  note: Note,
})
