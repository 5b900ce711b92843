// The material families (docs/domain.md, "Material") and the starting list a new shop gets. Pure.
// Starting wear factors are the shop's own first guesses relative to MDF (1.0), to be replaced
// by figures learned from the shop's history; they are not published values.
export const MATERIAL_FAMILIES = ['hard_plastic', 'soft_plastic', 'wood', 'sheet_goods', 'non_ferrous', 'foam', 'composite'] as const
export type MaterialFamily = (typeof MATERIAL_FAMILIES)[number]

export const FAMILY_LABELS: Record<MaterialFamily, string> = {
  hard_plastic: 'Hard plastic',
  soft_plastic: 'Soft plastic',
  wood: 'Wood',
  sheet_goods: 'Sheet goods',
  non_ferrous: 'Non-ferrous metal',
  foam: 'Foam',
  composite: 'Composite',
}

export interface StartingMaterial { name: string, family: MaterialFamily, wearFactor: number, common: boolean }

export const STARTING_MATERIALS: readonly StartingMaterial[] = [
  { name: 'MDF', family: 'sheet_goods', wearFactor: 1.0, common: true },
  { name: 'Plywood', family: 'sheet_goods', wearFactor: 1.2, common: true },
  { name: 'Hardwood', family: 'wood', wearFactor: 1.1, common: false },
  { name: 'Softwood', family: 'wood', wearFactor: 0.7, common: false },
  { name: 'Cast acrylic', family: 'hard_plastic', wearFactor: 0.9, common: true },
  { name: 'Extruded acrylic', family: 'soft_plastic', wearFactor: 0.8, common: false },
  { name: 'HDPE', family: 'soft_plastic', wearFactor: 0.6, common: true },
  { name: 'Polycarbonate', family: 'soft_plastic', wearFactor: 1.0, common: false },
  { name: 'PVC foam board', family: 'foam', wearFactor: 0.5, common: false },
  { name: 'Aluminium composite panel', family: 'composite', wearFactor: 1.6, common: true },
  { name: 'Aluminium 6061', family: 'non_ferrous', wearFactor: 2.5, common: false },
]
