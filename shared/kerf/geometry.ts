// The words of a cutter type's geometry (docs/domain.md, "Cutter type"), with the labels people see. Pure.
export const PROFILES = ['square_end', 'ball_nose', 'v_bit', 'o_flute'] as const
export type Profile = (typeof PROFILES)[number]
export const PROFILE_LABELS: Record<Profile, string> = {
  square_end: 'Square end',
  ball_nose: 'Ball nose',
  v_bit: 'V-bit',
  o_flute: 'O-flute',
}

export const HELIXES = ['upcut', 'downcut', 'compression', 'straight'] as const
export type Helix = (typeof HELIXES)[number]
export const HELIX_LABELS: Record<Helix, string> = {
  upcut: 'Upcut',
  downcut: 'Downcut',
  compression: 'Compression',
  straight: 'Straight',
}

export const TOOL_MATERIALS = ['solid_carbide', 'carbide_tipped', 'hss'] as const
export type ToolMaterial = (typeof TOOL_MATERIALS)[number]
export const TOOL_MATERIAL_LABELS: Record<ToolMaterial, string> = {
  solid_carbide: 'Solid carbide',
  carbide_tipped: 'Carbide-tipped',
  hss: 'HSS',
}

/** "Square end", "square-end" or "SQUARE_END" to the stored word "square_end". */
export function normaliseWord(text: string): string {
  return text.trim().toLowerCase().replace(/[\s-]+/g, '_')
}
