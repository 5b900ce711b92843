// The plain words shown for a cutter's geometry and for the outcome of a cut. Pure.
import type { CutOutcome } from './spindle'

export type Profile = 'square_end' | 'ball_nose' | 'v_bit' | 'o_flute'
export type Helix = 'upcut' | 'downcut' | 'compression' | 'straight'
export type ToolMaterial = 'solid_carbide' | 'carbide_tipped' | 'hss'

export const PROFILE_LABELS: Record<Profile, string> = {
  square_end: 'square end',
  ball_nose: 'ball nose',
  v_bit: 'V-bit',
  o_flute: 'O-flute',
}

export const HELIX_LABELS: Record<Helix, string> = {
  upcut: 'upcut',
  downcut: 'downcut',
  compression: 'compression',
  straight: 'straight flute',
}

export const TOOL_MATERIAL_LABELS: Record<ToolMaterial, string> = {
  solid_carbide: 'solid carbide',
  carbide_tipped: 'carbide-tipped',
  hss: 'HSS',
}


/** The word on the button and what it means at the machine. */
export const OUTCOME_WORDS: Record<CutOutcome, { label: string, hint: string }> = {
  clean: { label: 'Clean', hint: 'Good edge' },
  melted: { label: 'Melted', hint: 'Plastic melted or chips welded on' },
  chip_out: { label: 'Chip-out', hint: 'Chipped edge or face' },
  fuzzy: { label: 'Fuzzy', hint: 'Fuzz or burrs on the edge' },
  broken: { label: 'Broken', hint: 'The bit broke' },
}
