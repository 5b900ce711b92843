// Tooling cost per job (DESIGN.md computation 6, per job from the runs of NC programs): each run's
// cut logs cost minutes × wear factor / rated life new-cutter lives at the type's cost per life
// (cutCostCents, the same rule as the cost per cut-hour), summed per job reference, and divided
// by the sheets (repeats) the job's runs cut. Pure.
import { cutCostCents } from '../cost'

export interface JobUsage { jobRef: string, typeId: number, minutes: number, wearFactor: number, ratedLifeMinutes: number }
export interface JobCostRow { jobRef: string, runs: number, sheets: number, minutes: number, costCents: number, costPerSheetCents: number | null }

export function jobCostRows(
  usage: readonly JobUsage[], runs: ReadonlyMap<string, { runs: number, sheets: number }>, costPerLifeByType: ReadonlyMap<number, number>,
): JobCostRow[] {
  const byJob = new Map<string, { minutes: number, cost: number }>()
  for (const u of usage) {
    const row = byJob.get(u.jobRef) ?? { minutes: 0, cost: 0 }
    row.minutes += u.minutes
    row.cost += cutCostCents(u.minutes, u.wearFactor, u.ratedLifeMinutes, costPerLifeByType.get(u.typeId) ?? 0)
    byJob.set(u.jobRef, row)
  }
  return [...byJob].map(([jobRef, r]) => {
    const counts = runs.get(jobRef) ?? { runs: 0, sheets: 0 }
    return {
      jobRef, runs: counts.runs, sheets: counts.sheets, minutes: Math.round(r.minutes * 100) / 100, costCents: Math.round(r.cost),
      costPerSheetCents: counts.sheets > 0 ? Math.round(r.cost / counts.sheets) : null,
    }
  }).sort((a, b) => b.costCents - a.costCents || a.jobRef.localeCompare(b.jobRef))
}
