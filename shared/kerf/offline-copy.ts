// The copy of the shop a phone keeps for working without signal (GET /api/offline/copy), and the
// cutter page's view of one cutter built from it: the same figures the server shows, worked out
// with the same functions (remaining minutes, due notice), minus what the copy does not hold
// (recent cuts). Pure: no framework imports.
import { dueAction, dueReason } from './due'
import { remainingInMaterials } from './life'
import type { Helix, Profile, ToolMaterial } from './geometry'
import type { Role } from './roles'
import type { CutterStatus } from './status'
import { normalizeLabelCode } from './label-code'
import type { MaterialFamily } from './materials'

export type Flag = 'dull' | 'broken' | null

/** One cutter: [id, code, typeId, status, machineId, regrindCount, diameterMm, lifeUsed, lifeScale,
 *  minutesTotal, minutesThisLife, flagged]. Rows rather than objects keep a big crib's copy small. */
export type OfflineCutterRow = [number, string, number, CutterStatus, number | null, number, number, number, number, number, number, Flag]

export interface OfflineType {
  id: number, name: string, ratedLifeMinutes: number, flutes: number, cuttingDiameterMm: number, shankDiameterMm: number,
  helix: Helix, profile: Profile, vAngleDeg: number | null, toolMaterial: ToolMaterial, maxRegrinds: number,
  regrindDiameterLossMm: number, minUsableDiameterMm: number
}
export interface OfflineMaterial { id: number, name: string, family: MaterialFamily, wearFactor: number, common: boolean }
/** A machine as GET /api/machines answers it (pockets 0: a manual collet), with the cutters in it. */
export interface OfflineMachine { id: number, name: string, pockets: number, loaded: Array<{ id: number, code: string, pocket: number | null }> }

export interface OfflineCopy {
  /** When the server made it (ISO): the page says how old what it shows is. */
  takenAt: string
  user: { id: number, shopId: number, name: string, role: Role }
  shop: { lifeThreshold: number, shiftMinutes: number, timeZone: string }
  types: OfflineType[]
  cutters: OfflineCutterRow[]
  materials: OfflineMaterial[]
  machines: OfflineMachine[]
}

/** The cutter with this label code as the cutter page shows it, or null when the copy has no such code. */
export function cutterFromCopy(copy: OfflineCopy, code: string) {
  const wanted = normalizeLabelCode(code)
  const row = copy.cutters.find((c) => c[1] === wanted)
  if (!row) return null
  const [id, rowCode, typeId, status, machineId, regrindCount, diameterMm, lifeUsed, lifeScale, minutesTotal, minutesThisLife, flagged] = row
  const type = copy.types.find((t) => t.id === typeId)
  if (!type) return null
  const machine = machineId === null ? null : { id: machineId, name: copy.machines.find((m) => m.id === machineId)?.name ?? '' }
  const forDue = { status, lifeUsed, flagged, regrindCount, diameterMm }
  const reason = dueReason(forDue, copy.shop.lifeThreshold)
  return {
    id,
    code: rowCode,
    status,
    machine,
    regrindCount,
    diameterMm,
    lifeUsed,
    lifeScale,
    minutesTotal,
    minutesThisLife,
    flagged,
    flaggedAt: null,
    retiredReason: null,
    receivedAt: null,
    lifeThreshold: copy.shop.lifeThreshold,
    // The copy holds no cut logs: without a connection only the shift bounds a cut.
    usual: { shiftMinutes: copy.shop.shiftMinutes, longestCutMinutes: null },
    due: reason && { reason, action: dueAction(forDue, type) },
    type: {
      id: type.id, name: type.name, ratedLifeMinutes: type.ratedLifeMinutes, flutes: type.flutes, cuttingDiameterMm: type.cuttingDiameterMm,
      shankDiameterMm: type.shankDiameterMm, helix: type.helix, profile: type.profile, vAngleDeg: type.vAngleDeg,
      toolMaterial: type.toolMaterial, maxRegrinds: type.maxRegrinds,
    },
    remainingMinutes: remainingInMaterials(copy.materials, lifeUsed, type.ratedLifeMinutes, lifeScale),
    recentCuts: [] as never[],
  }
}
export type CutterFromCopy = NonNullable<ReturnType<typeof cutterFromCopy>>

