// The inventory page's filters, sort and page, kept in the URL so that reload and Back keep them.
// The page changes `state`; one watcher writes the URL, so a sort and its page reset make one entry.
import type { SortingState } from '@tanstack/vue-table'
import type { LocationQuery } from 'vue-router'
import { CUTTER_STATUSES, type CutterStatus } from '#shared/kerf/status'
import { INVENTORY_PAGE_SIZE, INVENTORY_SORTS } from '#shared/schemas/inventory'

export const LIFE_BAND_KEYS = ['fresh', 'midlife', 'worn', 'due'] as const
export type LifeBand = (typeof LIFE_BAND_KEYS)[number]

/** The life-used choices of the inventory, split at half a life and at the shop's resharpen threshold. */
export function lifeBands(threshold: number): Array<{ key: LifeBand, label: string, query: Record<string, number | boolean> }> {
  const half = Math.min(0.5, threshold)
  const pct = (f: number) => `${Number((f * 100).toFixed(1))} %`
  return [
    { key: 'fresh', label: `Under ${pct(half)}`, query: { lifeMax: half } },
    { key: 'midlife', label: `${pct(half).replace(' %', '')} to ${pct(threshold)}`, query: { lifeMin: half, lifeMax: threshold } },
    { key: 'worn', label: `${pct(threshold)} or more`, query: { lifeMin: threshold } },
    { key: 'due', label: 'Due for attention', query: { due: true } },
  ]
}

export interface InventoryState {
  status: CutterStatus[]
  typeId: string
  machineId: string
  life: LifeBand | ''
  q: string
  sort: string
  page: number
}

const DEFAULT_SORT = 'code'
const one = (v: LocationQuery[string] | undefined) => (Array.isArray(v) ? v[0] : v) ?? ''

function fromQuery(q: LocationQuery): InventoryState {
  const life = one(q.life)
  const sort = one(q.sort)
  return {
    status: one(q.status).split(',').filter((s): s is CutterStatus => (CUTTER_STATUSES as readonly string[]).includes(s)),
    typeId: /^\d+$/.test(one(q.typeId)) ? one(q.typeId) : '',
    machineId: /^\d+$/.test(one(q.machineId)) ? one(q.machineId) : '',
    life: (LIFE_BAND_KEYS as readonly string[]).includes(life) ? life as LifeBand : '',
    q: one(q.q).slice(0, 60),
    sort: (INVENTORY_SORTS as readonly string[]).includes(sort.replace(/^-/, '')) ? sort : DEFAULT_SORT,
    page: Math.max(1, Number.parseInt(one(q.page), 10) || 1),
  }
}

/** Only what differs from the defaults goes into the URL. */
function toQuery(s: InventoryState): Record<string, string> {
  const out: Record<string, string> = {}
  if (s.status.length) out.status = s.status.join(',')
  if (s.typeId) out.typeId = s.typeId
  if (s.machineId) out.machineId = s.machineId
  if (s.life) out.life = s.life
  if (s.q.trim()) out.q = s.q.trim()
  if (s.sort !== DEFAULT_SORT) out.sort = s.sort
  if (s.page > 1) out.page = String(s.page)
  return out
}

const sameQuery = (a: Record<string, string>, b: LocationQuery) =>
  Object.keys(a).length === Object.keys(b).length && Object.entries(a).every(([k, v]) => one(b[k]) === v)

/** `threshold`: the shop's resharpen threshold, which the life bands split at. */
export function useInventoryQuery(threshold: Ref<number>) {
  const route = useRoute()
  const router = useRouter()
  const state = reactive(fromQuery(route.query))
  let replaceNext = false
  // Typing pushes one history entry for the search, then replaces it while the typing goes on.
  let typing = false

  // Back and Forward (and links) change the URL: follow it.
  watch(() => route.query, (q) => {
    if (!sameQuery(toQuery(state), q)) Object.assign(state, fromQuery(q))
  })
  watch(state, () => {
    const query = toQuery(state)
    if (sameQuery(query, route.query)) return
    const how = replaceNext ? 'replace' : 'push'
    replaceNext = false
    router[how]({ query })
  }, { deep: true })

  /** Changes filters and goes back to the first page; `typing` keeps each keystroke out of the Back history. */
  function filter(change: Partial<Omit<InventoryState, 'page' | 'sort'>>, opts: { typing?: boolean } = {}) {
    replaceNext = Boolean(opts.typing) && typing
    typing = Boolean(opts.typing)
    Object.assign(state, change, { page: 1 })
  }

  const sorting = computed<SortingState>({
    get: () => [{ id: state.sort.replace(/^-/, ''), desc: state.sort.startsWith('-') }],
    set: (next) => {
      typing = false
      state.sort = next[0] ? `${next[0].desc ? '-' : ''}${next[0].id}` : DEFAULT_SORT
    },
  })
  const page = computed({
    get: () => state.page,
    set: (p: number) => {
      typing = false
      state.page = p
    },
  })

  /** After a page past the end (an old link, or rows gone since), go to the last page in place. */
  function lastPage(last: number) {
    replaceNext = true
    typing = false
    state.page = Math.max(1, last)
  }

  const filtered = computed(() => Boolean(state.status.length || state.typeId || state.machineId || state.life || state.q.trim()))
  function clear() {
    filter({ status: [], typeId: '', machineId: '', life: '', q: '' })
  }

  /** The query for GET /api/cutters. */
  const apiQuery = computed(() => ({
    ...(state.status.length && { status: state.status.join(',') }),
    ...(state.typeId && { typeId: state.typeId }),
    ...(state.machineId && { machineId: state.machineId }),
    ...(state.q.trim() && { q: state.q.trim() }),
    ...lifeBands(threshold.value).find((b) => b.key === state.life)?.query,
    sort: state.sort,
    page: state.page,
    pageSize: INVENTORY_PAGE_SIZE,
  }))

  return { state, filter, sorting, page, lastPage, filtered, clear, apiQuery }
}
