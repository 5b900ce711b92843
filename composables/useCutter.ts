// One cutter as its page shows it (GET /api/cutters/by-code/:code), and the lists the page's
// forms choose from. Types follow the API contract of the spindle routes.
import type { CutterStatus } from '#shared/kerf/status'
import type { CutOutcome, Helix, Profile, ToolMaterial } from '#shared/kerf/cutter-words'

export interface CutterView {
  id: number
  code: string
  status: CutterStatus
  machine: { id: number, name: string } | null
  regrindCount: number
  diameterMm: number
  /** Fraction of the current sharp life used; may pass 1. */
  lifeUsed: number
  lifeScale: number
  minutesTotal: number
  flagged: 'dull' | 'broken' | null
  lifeThreshold: number
  due: { reason: 'life_used' | 'flagged_dull', action: 'resharpen' | 'retire' } | null
  type: {
    id: number
    name: string
    ratedLifeMinutes: number
    flutes: number
    cuttingDiameterMm: number
    shankDiameterMm: number
    helix: Helix
    profile: Profile
    vAngleDeg: number | null
    toolMaterial: ToolMaterial
  }
  remainingMinutes: RemainingInMaterial[]
  recentCuts: RecentCut[]
}

export interface RemainingInMaterial { materialId: number, materialName: string, common: boolean, minutes: number }

export interface RecentCut {
  id: string | number
  cutAt: string
  minutes: number
  materialName: string
  machineName: string | null
  operatorName: string | null
  outcome: CutOutcome
  rpm: number | null
  feedMmPerMin: number | null
  note: string
}

export interface MachineChoice { id: number, name: string, description: string, minRpm: number, maxRpm: number, toolChanger: boolean }
export interface MaterialChoice { id: number, name: string, family: string, wearFactor: number, common: boolean }

/** The cutter with this label code; nothing is asked of the server for a code that cannot exist. */
export function useCutter(code: MaybeRefOrGetter<string>, options: { valid: boolean }) {
  return useFetch<CutterView>(() => `/api/cutters/by-code/${encodeURIComponent(toValue(code))}`, {
    key: `cutter:${toValue(code)}`,
    immediate: options.valid,
  })
}

/** The shop's machines; loaded without blocking the page, and kept for the next visit. */
export function useMachines() {
  return useFetch<MachineChoice[]>('/api/machines', { key: 'machines', lazy: true, default: () => [] })
}

/** The shop's materials, common ones first. Loaded with the page so the cut form works offline. */
export function useMaterials() {
  return useFetch<MaterialChoice[]>('/api/materials', { key: 'materials', lazy: true, default: () => [] })
}
