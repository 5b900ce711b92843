// Glass-transition and melting temperatures of the plastics routing shops cut, for the reasons the
// bit chooser gives (shared/kerf/bit-choice.ts). Pure.
// Source: W. D. Callister, Materials Science and Engineering: An Introduction, appendix table of
// glass-transition and melting temperatures of common polymeric materials.
export const CALLISTER_POLYMERS = 'W. D. Callister, Materials Science and Engineering, appendix: glass-transition and melting temperatures of polymers'

export interface Polymer {
  key: 'pmma' | 'hdpe' | 'pc' | 'pvc'
  name: string
  /** Glass-transition temperature, °C. */
  tgC: number
  /** Melting temperature, °C; null for an amorphous polymer, which softens rather than melts. */
  tmC: number | null
  /** Words in a shop's material name that mean this polymer. */
  match: RegExp
}

export const POLYMERS: readonly Polymer[] = [
  // PMMA is amorphous: it has no melting point, only a softening range above its Tg.
  { key: 'pmma', name: 'acrylic (PMMA)', tgC: 105, tmC: null, match: /acryl|pmma/i },
  { key: 'hdpe', name: 'HDPE', tgC: -90, tmC: 137, match: /hdpe|polyethylene/i },
  { key: 'pc', name: 'polycarbonate', tgC: 150, tmC: 265, match: /polycarbonate|\bpc\b/i },
  { key: 'pvc', name: 'PVC', tgC: 87, tmC: 212, match: /pvc|vinyl/i },
]

/** The polymer a shop's material name stands for, if it names one of the four. */
export function polymerOf(materialName: string): Polymer | null {
  return POLYMERS.find((p) => p.match.test(materialName)) ?? null
}

/** "HDPE melts at 137 °C" / "acrylic (PMMA) softens above about 105 °C". */
export function heatLimit(p: Polymer): string {
  return p.tmC === null
    ? `${p.name} softens above about ${p.tgC} °C`
    : `${p.name} melts at ${p.tmC} °C`
}
