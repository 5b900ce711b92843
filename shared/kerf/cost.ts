// Tooling cost (DESIGN.md computation 6): what a sharp life of a cutter type costs, what each
// cut used of it, and the cost per hour of cutting by material, machine, operator or type.
// Pure: no framework or database imports. Money in cents (fractions kept until the end).
import { livesPerCutter } from './reorder'

export interface TypeCosts {
  unitCostCents: number
  regrindCostCents: number
  maxRegrinds: number
}

/**
 * Cost of one new-cutter life: (purchase + every allowed regrind) / lives per cutter, where a
 * cutter gives 1 + max regrinds × regrind fraction lives. A reground life is only that fraction
 * of a new one, so it costs that share: the regrind's price spread over the life it buys back,
 * together with the purchase spread over the whole career.
 */
export function costPerLifeCents(type: TypeCosts, regrindLifeFraction: number): number {
  return (type.unitCostCents + type.maxRegrinds * type.regrindCostCents) / livesPerCutter(type.maxRegrinds, regrindLifeFraction)
}

/**
 * The rule for one cut log: tooling cost = new-cutter lives it used × cost per life, where the
 * lives used are minutes × wear factor / rated life (= life_added × life_scale: a minute on a
 * reground cutter costs the same as on a new one, because a reground life is shorter and
 * costs its share). Over a cutter's whole career this adds up to purchase + regrinds.
 */
export function cutCostCents(minutes: number, wearFactor: number, ratedLifeMinutes: number, costPerLife: number): number {
  return (minutes * wearFactor / ratedLifeMinutes) * costPerLife
}

/** Cents per hour of cutting, or null when nothing was cut. */
export function costPerCutHourCents(toolingCostCents: number, minutes: number): number | null {
  return minutes > 0 ? toolingCostCents / (minutes / 60) : null
}

/** One slice of the cutting (a material and type on a day, say) to be added up. */
export interface UsageSlice {
  key: number | string
  name: string
  typeId: number
  minutes: number
  /** Σ minutes × wear factor / rated life: new-cutter lives used. */
  newLives: number
}

export interface CostRow {
  key: number | string
  name: string
  cutHours: number
  toolingCostCents: number
  costPerCutHourCents: number | null
}

/** Adds slices up by key; each slice is priced at its own type's cost per life. Dearest hour first. */
export function costRows(slices: readonly UsageSlice[], costPerLifeByType: ReadonlyMap<number, number>): CostRow[] {
  const by = new Map<number | string, { name: string, minutes: number, cents: number }>()
  for (const s of slices) {
    const row = by.get(s.key) ?? { name: s.name, minutes: 0, cents: 0 }
    row.minutes += s.minutes
    row.cents += s.newLives * (costPerLifeByType.get(s.typeId) ?? 0)
    by.set(s.key, row)
  }
  return [...by.entries()].map(([key, r]) => {
    const perHour = costPerCutHourCents(r.cents, r.minutes)
    return {
      key,
      name: r.name,
      cutHours: Math.round((r.minutes / 60) * 100) / 100,
      toolingCostCents: Math.round(r.cents),
      costPerCutHourCents: perHour === null ? null : Math.round(perHour),
    }
  }).sort((a, b) => (b.costPerCutHourCents ?? -1) - (a.costPerCutHourCents ?? -1) || String(a.name).localeCompare(String(b.name)))
}

/** Share of logs that ended in a given outcome, or null with no logs. */
export function rate(count: number, logs: number): number | null {
  return logs > 0 ? count / logs : null
}

/** What hand-finishing costs a part: cleanup minutes × the shop's labour rate per hour, in whole
 *  cents; null when either is unknown. */
export function cleanupCentsPerPart(minutesPerPart: number | null, labourRateCentsPerHour: number | null): number | null {
  if (minutesPerPart === null || labourRateCentsPerHour === null) return null
  return Math.round((minutesPerPart * labourRateCentsPerHour) / 60)
}
