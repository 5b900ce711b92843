// The invented demo shop "Millrace Signs & Displays": its people, machines, materials,
// suppliers, catalogue and the stories of its cutters. Constants only; demo.ts builds the rows.
import type { Helix, MaterialFamily, Profile, Role } from '../schema'

export const DEMO_SHOP = {
  name: 'Millrace Signs & Displays',
  lifeThreshold: 0.9,
  regrindLifeFraction: 0.8,
  // Hand-finishing, $42.00 an hour: prices the cleanup minutes on the owner's insights.
  labourRateCentsPerHour: 4200,
  reportRecipients: ['crib@example.com', 'owner@example.com'],
}

export const DEMO_PASSWORD = 'kerfbook-demo'

export interface DemoPerson { email: string, name: string, role: Role }

export const PEOPLE: DemoPerson[] = [
  { email: 'owner@example.com', name: 'Odile Marchetti', role: 'owner' },
  { email: 'crib@example.com', name: 'Bram Castellan', role: 'crib_manager' },
  { email: 'operator@example.com', name: 'Jonah Pell', role: 'operator' },
  { email: 'operator2@example.com', name: 'Suki Anand', role: 'operator' },
  { email: 'operator3@example.com', name: 'Ravi Lindqvist', role: 'operator' },
]
export const CRIB_EMAIL = 'crib@example.com'

export interface DemoMachine {
  key: string, name: string, description: string, minRpm: number, maxRpm: number, pockets: number
  /** The operator who runs it most; the others fill in. */
  mainOperator: string
  /** Largest shank its collets take, mm. */
  maxShankMm: number
}

export const MACHINES: DemoMachine[] = [
  { key: 'big', name: 'Big Bay 4×8', description: '4×8 ft router with a linear tool changer and vacuum table', minRpm: 6000, maxRpm: 24000, pockets: 8, mainOperator: 'operator@example.com', maxShankMm: 12.7 },
  { key: 'long', name: 'Long Bay 5×10', description: '5×10 ft router, manual collet changes', minRpm: 8000, maxRpm: 24000, pockets: 0, mainOperator: 'operator2@example.com', maxShankMm: 12.7 },
  { key: 'bench', name: 'Little Bench', description: 'Desktop router for engraving and small parts', minRpm: 10000, maxRpm: 30000, pockets: 0, mainOperator: 'operator3@example.com', maxShankMm: 6.35 },
]

export interface DemoMaterial { key: string, name: string, family: MaterialFamily, wearFactor: number, common: boolean }

// Wear factors are the shop's own starting guesses, MDF being the reference (1.0).
export const MATERIALS: DemoMaterial[] = [
  { key: 'cast', name: 'Cast acrylic', family: 'hard_plastic', wearFactor: 0.8, common: true },
  { key: 'extruded', name: 'Extruded acrylic', family: 'soft_plastic', wearFactor: 0.6, common: false },
  { key: 'hdpe', name: 'HDPE', family: 'soft_plastic', wearFactor: 0.5, common: true },
  { key: 'pc', name: 'Polycarbonate', family: 'soft_plastic', wearFactor: 0.9, common: false },
  { key: 'pvc', name: 'PVC foam board', family: 'foam', wearFactor: 0.4, common: false },
  { key: 'mdf', name: 'MDF', family: 'sheet_goods', wearFactor: 1.0, common: true },
  { key: 'ply', name: 'Plywood', family: 'sheet_goods', wearFactor: 1.2, common: true },
  { key: 'hardwood', name: 'Hardwood', family: 'wood', wearFactor: 1.1, common: false },
  { key: 'softwood', name: 'Softwood', family: 'wood', wearFactor: 0.7, common: false },
  { key: 'acp', name: 'Aluminium composite panel', family: 'composite', wearFactor: 1.4, common: true },
  { key: 'alu', name: 'Aluminium 6061', family: 'non_ferrous', wearFactor: 2.5, common: false },
]

export const SUPPLIERS = [
  { key: 'copperline', name: 'Copperline Cutting Tools', email: 'sales.copperline@example.com', phone: '555-0142', leadTimeDays: 5, note: 'Stock items ship the next day.' },
  { key: 'harrowgate', name: 'Harrowgate Tool & Regrind', email: 'regrind.harrowgate@example.com', phone: '555-0187', leadTimeDays: 12, note: 'Also resharpens: about ten days there and back.' },
] as const
/** Who resharpens the shop's bits. */
export const REGRIND_SUPPLIER = 'harrowgate'

export interface DemoCutterType {
  key: string, name: string, supplier: string, part: string, profile: Profile, vAngle: number | null, helix: Helix
  flutes: number, diameter: number, shank: number, cutLength: number, overallLength: number, ratedLife: number
  maxRegrinds: number, regrindLoss: number, minUsable: number, unitCost: number, regrindCost: number, packSize: number
  leadTimeOverride: number | null
  /** How many of these the shop owns (all statuses). */
  count: number
  /** What this geometry cuts in this shop, with relative shares of its minutes. */
  materials: Record<string, number>
}

const type = (t: Omit<DemoCutterType, 'leadTimeOverride'> & { leadTimeOverride?: number }): DemoCutterType =>
  ({ leadTimeOverride: null, ...t })

export const CUTTER_TYPES: DemoCutterType[] = [
  type({ key: 'of3', name: 'O-flute upcut 1/8" plastics', supplier: 'copperline', part: 'CL-O1-125', profile: 'o_flute', vAngle: null, helix: 'upcut', flutes: 1, diameter: 3.175, shank: 3.175, cutLength: 12.7, overallLength: 50.8, ratedLife: 600, maxRegrinds: 0, regrindLoss: 0.1, minUsable: 3.1, unitCost: 2500, regrindCost: 0, packSize: 5, count: 12, materials: { cast: 6, extruded: 2, pc: 1, pvc: 1 } }),
  type({ key: 'of6', name: 'O-flute upcut 1/4" plastics & aluminium', supplier: 'copperline', part: 'CL-O1-250', profile: 'o_flute', vAngle: null, helix: 'upcut', flutes: 1, diameter: 6.35, shank: 6.35, cutLength: 22.225, overallLength: 63.5, ratedLife: 1200, maxRegrinds: 2, regrindLoss: 0.15, minUsable: 6.0, unitCost: 4600, regrindCost: 1400, packSize: 2, count: 13, materials: { cast: 4, hdpe: 4, acp: 3, extruded: 1, pc: 1, alu: 1 } }),
  type({ key: 'up6', name: 'Two-flute upcut 1/4" wood', supplier: 'harrowgate', part: 'HG-2U-250', profile: 'square_end', vAngle: null, helix: 'upcut', flutes: 2, diameter: 6.35, shank: 6.35, cutLength: 25.4, overallLength: 63.5, ratedLife: 1500, maxRegrinds: 3, regrindLoss: 0.15, minUsable: 5.85, unitCost: 3900, regrindCost: 1200, packSize: 2, count: 8, materials: { mdf: 4, hardwood: 1, softwood: 1, pvc: 1, hdpe: 1 } }),
  type({ key: 'dn6', name: 'Two-flute downcut 1/4" sheet goods', supplier: 'harrowgate', part: 'HG-2D-250', profile: 'square_end', vAngle: null, helix: 'downcut', flutes: 2, diameter: 6.35, shank: 6.35, cutLength: 25.4, overallLength: 63.5, ratedLife: 1500, maxRegrinds: 3, regrindLoss: 0.15, minUsable: 5.85, unitCost: 3900, regrindCost: 1200, packSize: 2, count: 5, materials: { ply: 3, mdf: 2, hardwood: 1 } }),
  type({ key: 'cp6', name: 'Two-flute compression 1/4" sheet goods', supplier: 'copperline', part: 'CL-2C-250', profile: 'square_end', vAngle: null, helix: 'compression', flutes: 2, diameter: 6.35, shank: 6.35, cutLength: 22.225, overallLength: 76.2, ratedLife: 1800, maxRegrinds: 2, regrindLoss: 0.2, minUsable: 5.9, unitCost: 5600, regrindCost: 1600, packSize: 2, count: 10, materials: { ply: 4, mdf: 4 } }),
  type({ key: 'up10', name: 'Two-flute upcut 3/8" wood', supplier: 'harrowgate', part: 'HG-2U-375', profile: 'square_end', vAngle: null, helix: 'upcut', flutes: 2, diameter: 9.525, shank: 12.7, cutLength: 28.575, overallLength: 76.2, ratedLife: 2000, maxRegrinds: 3, regrindLoss: 0.2, minUsable: 8.9, unitCost: 6200, regrindCost: 1800, packSize: 1, count: 2, materials: { mdf: 4, hardwood: 1, softwood: 1 } }),
  type({ key: 'dn10', name: 'Two-flute downcut 3/8" sheet goods', supplier: 'harrowgate', part: 'HG-2D-375', profile: 'square_end', vAngle: null, helix: 'downcut', flutes: 2, diameter: 9.525, shank: 9.525, cutLength: 28.575, overallLength: 76.2, ratedLife: 2000, maxRegrinds: 3, regrindLoss: 0.2, minUsable: 8.9, unitCost: 6200, regrindCost: 1800, packSize: 1, count: 3, materials: { ply: 3, mdf: 2 } }),
  type({ key: 'cp10', name: 'Two-flute compression 3/8" sheet goods', supplier: 'copperline', part: 'CL-2C-375', profile: 'square_end', vAngle: null, helix: 'compression', flutes: 2, diameter: 9.525, shank: 12.7, cutLength: 31.75, overallLength: 88.9, ratedLife: 2200, maxRegrinds: 2, regrindLoss: 0.25, minUsable: 8.95, unitCost: 7400, regrindCost: 2000, packSize: 1, count: 6, materials: { ply: 4, mdf: 3 } }),
  type({ key: 'cp13', name: 'Two-flute compression 1/2" sheet goods', supplier: 'harrowgate', part: 'HG-2C-500', profile: 'square_end', vAngle: null, helix: 'compression', flutes: 2, diameter: 12.7, shank: 12.7, cutLength: 38.1, overallLength: 88.9, ratedLife: 2400, maxRegrinds: 3, regrindLoss: 0.25, minUsable: 11.9, unitCost: 8900, regrindCost: 2200, packSize: 1, leadTimeOverride: 21, count: 6, materials: { ply: 3, mdf: 3 } }),
  type({ key: 'v60', name: 'V-bit 60° engraving', supplier: 'copperline', part: 'CL-V60-500', profile: 'v_bit', vAngle: 60, helix: 'straight', flutes: 2, diameter: 12.7, shank: 6.35, cutLength: 11.0, overallLength: 63.5, ratedLife: 900, maxRegrinds: 1, regrindLoss: 0.1, minUsable: 12.5, unitCost: 3200, regrindCost: 1000, packSize: 1, count: 5, materials: { cast: 4, mdf: 2, hardwood: 1, pvc: 1 } }),
  type({ key: 'v90', name: 'V-bit 90° grooving and folding', supplier: 'harrowgate', part: 'HG-V90-500', profile: 'v_bit', vAngle: 90, helix: 'straight', flutes: 2, diameter: 12.7, shank: 6.35, cutLength: 6.35, overallLength: 63.5, ratedLife: 900, maxRegrinds: 1, regrindLoss: 0.1, minUsable: 12.5, unitCost: 3000, regrindCost: 1000, packSize: 1, count: 5, materials: { acp: 5, mdf: 1, cast: 1 } }),
  type({ key: 'bn6', name: 'Ball-nose 1/4" 3D carving', supplier: 'harrowgate', part: 'HG-BN-250', profile: 'ball_nose', vAngle: null, helix: 'upcut', flutes: 2, diameter: 6.35, shank: 6.35, cutLength: 25.4, overallLength: 76.2, ratedLife: 1000, maxRegrinds: 1, regrindLoss: 0.15, minUsable: 6.15, unitCost: 4200, regrindCost: 1500, packSize: 1, count: 3, materials: { mdf: 3, hdpe: 2, hardwood: 1, pvc: 1 } }),
]

/** How a cutter's year ends. in_crib fillers (everything not listed below) are drawn by the generator. */
export type Ending = 'in_crib' | 'due' | 'dull' | 'new' | 'in_spindle' | 'at_regrind' | 'worn' | 'broken' | 'undersize' | 'lost'

export interface Story { type: string, ending: Ending, regrinds?: number, machine?: string }

// The cutters whose story is not the ordinary one. Regrinds are capped by the type's maximum.
export const STORIES: Story[] = [
  { type: 'of3', ending: 'worn' }, { type: 'of3', ending: 'worn' }, { type: 'of3', ending: 'worn' },
  { type: 'of6', ending: 'worn', regrinds: 2 }, { type: 'cp6', ending: 'worn', regrinds: 2 },
  { type: 'v90', ending: 'worn', regrinds: 1 }, { type: 'cp10', ending: 'worn', regrinds: 2 },
  { type: 'of3', ending: 'broken' }, { type: 'up10', ending: 'broken', regrinds: 1 }, { type: 'cp6', ending: 'broken' },
  { type: 'cp10', ending: 'undersize', regrinds: 1 }, { type: 'up6', ending: 'undersize' },
  { type: 'v60', ending: 'lost' }, { type: 'of3', ending: 'lost' }, { type: 'bn6', ending: 'lost' },
  { type: 'of6', ending: 'at_regrind', regrinds: 1 }, { type: 'of6', ending: 'at_regrind' },
  { type: 'cp6', ending: 'at_regrind', regrinds: 1 }, { type: 'cp6', ending: 'at_regrind' },
  { type: 'cp13', ending: 'at_regrind', regrinds: 2 }, { type: 'up10', ending: 'at_regrind' }, { type: 'dn6', ending: 'at_regrind', regrinds: 1 },
  // Big Bay's tool changer holds six; the other two spindles hold one each.
  { type: 'cp6', ending: 'in_spindle', machine: 'big', regrinds: 1 }, { type: 'cp13', ending: 'in_spindle', machine: 'big' },
  { type: 'up6', ending: 'in_spindle', machine: 'big', regrinds: 2 }, { type: 'v90', ending: 'in_spindle', machine: 'big' },
  { type: 'of6', ending: 'in_spindle', machine: 'big', regrinds: 1 }, { type: 'cp10', ending: 'in_spindle', machine: 'big' },
  { type: 'dn10', ending: 'in_spindle', machine: 'long', regrinds: 1 }, { type: 'v60', ending: 'in_spindle', machine: 'bench' },
  { type: 'of6', ending: 'due', regrinds: 1 }, { type: 'cp6', ending: 'due' }, { type: 'up6', ending: 'due', regrinds: 2 }, { type: 'of3', ending: 'due' },
  { type: 'cp13', ending: 'dull', regrinds: 1 }, { type: 'of6', ending: 'dull' }, { type: 'dn6', ending: 'dull' },
  { type: 'of3', ending: 'new' }, { type: 'of3', ending: 'new' }, { type: 'cp6', ending: 'new' }, { type: 'of6', ending: 'new' }, { type: 'v60', ending: 'new' },
]

/** The order still open with the supplier: type key → quantity. */
export const OPEN_ORDER: Record<string, number> = { of3: 10, cp6: 4, of6: 4, v90: 2 }
