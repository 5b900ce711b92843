// Which bit for this material and this cut (DESIGN.md computation 8). The trade's rules are data:
// each says when it applies, what it makes of the type (a prior share of clean cuts, or only a
// note), why, and where that comes from. The shop's own outcomes then pull each type's share of
// clean cuts away from the rule's prior as logs accumulate (a Beta prior worth PRIOR_LOGS logs;
// docs/domain.md works an example). Pure: no framework or database imports.
import type { Helix, Profile } from './geometry'
import type { MaterialFamily } from './materials'
import { CALLISTER_POLYMERS, heatLimit, polymerOf } from './polymers'

export const CUT_KINDS = ['profile', 'pocket', 'slot', 'engrave', 'drill', 'surface_3d'] as const
export type CutKind = (typeof CUT_KINDS)[number]
export const CUT_KIND_LABELS: Record<CutKind, string> = {
  profile: 'Profile / cut-out',
  pocket: 'Pocket',
  slot: 'Slot',
  engrave: 'Engrave / V-carve',
  drill: 'Drill',
  surface_3d: '3D surface',
}

export type Fit = 'good' | 'fair' | 'poor'
export const FIT_LABELS: Record<Fit, string> = { good: 'Good fit', fair: 'Fair fit', poor: 'Poor fit' }
const FIT_ORDER: Record<Fit, number> = { good: 0, fair: 1, poor: 2 }

export type SourceKind = 'common_practice' | 'published' | 'ours'
export interface Source { kind: SourceKind, text: string }
export const SOURCES = {
  practice: { kind: 'common_practice', text: 'Common practice in the trade' },
  callister: { kind: 'published', text: CALLISTER_POLYMERS },
  ours: { kind: 'ours', text: 'Kerfbook\'s own starting figure, to be replaced by the shop\'s results' },
} as const satisfies Record<string, Source>

/** The cutter type as the rules see it. */
export interface BitGeometry {
  profile: Profile
  helix: Helix
  flutes: number
  cuttingDiameterMm: number
  cuttingLengthMm: number
  vAngleDeg: number | null
}

export interface Job {
  family: MaterialFamily
  materialName: string
  cut: CutKind
  /** Sheet thickness, mm: a through cut needs at least this much cutting length plus a margin. */
  thicknessMm?: number | null
  /** The narrowest slot or gap the bit must fit, mm, when the shop gives it. */
  narrowestMm?: number | null
}

/** Priors: the share of clean cuts a type is expected to give before the shop has logged any.
 *  Our own starting figures (SOURCES.ours); levels are read off them with FIT_THRESHOLDS. */
export const PRIOR = { best: 0.92, good: 0.88, fair: 0.65, poor: 0.3 } as const
/** A share of clean cuts at or above `good` is a good fit, at or above `fair` a fair one. */
export const FIT_THRESHOLDS = { good: 0.75, fair: 0.5 } as const
/** What the rule's prior is worth, in logs: the Beta prior's a + b. */
export const PRIOR_LOGS = 20
/** Margin of cutting length beyond the sheet for a through cut, mm (common practice: cut a
 *  little into the spoilboard so the last skin is cut, not torn). */
export const THROUGH_MARGIN_MM = 1
/** Largest diameter of a square-end bit that still engraves fine lines (1/8 in). */
export const FINE_ENGRAVING_MM = 3.2

const PLASTICS: readonly MaterialFamily[] = ['hard_plastic', 'soft_plastic', 'foam']
// The trade's quick test: a knife cuts a soft plastic easily. Foam board is soft.
const SOFT_PLASTICS: readonly MaterialFamily[] = ['soft_plastic', 'foam']
const METALS: readonly MaterialFamily[] = ['non_ferrous', 'composite']
const WOODS: readonly MaterialFamily[] = ['wood', 'sheet_goods']
const STRAIGHT_WALLED: readonly Profile[] = ['square_end', 'o_flute']
const CUTS_WITH_WALLS: readonly CutKind[] = ['profile', 'pocket', 'slot']

export interface Rule {
  id: string
  when: (t: BitGeometry, job: Job) => boolean
  /** The share of clean cuts the rule expects; null for a note that does not change the fit. */
  prior: number | null
  /** True when no result of the shop can lift the type out of a poor fit: it cannot do the job. */
  hard?: boolean
  reason: (t: BitGeometry, job: Job) => string
  sources: readonly Source[]
}

const mm = (v: number) => `${Number(v.toFixed(2))} mm`
const helixWord = (t: BitGeometry) => t.helix === 'compression' ? 'A compression bit (downcut at the top)' : 'A downcut bit'
const upcutSingle = (t: BitGeometry) => t.helix === 'upcut' && t.flutes === 1 && STRAIGHT_WALLED.includes(t.profile)
const upcutMulti = (t: BitGeometry) => t.helix === 'upcut' && t.flutes >= 2 && STRAIGHT_WALLED.includes(t.profile)
/** ", and HDPE melts at 137 °C" when the material names one of the tabled polymers. */
const heat = (job: Job) => {
  const p = polymerOf(job.materialName)
  return p ? ` (${heatLimit(p)})` : ''
}
const heatSources = (extra: readonly Source[] = []) => [SOURCES.practice, ...extra]

/** The rules of the trade. Order does not matter: every rule that applies is reported. */
export const RULES: readonly Rule[] = [
  // What the bit is for.
  {
    id: 'v_bit_engraves',
    when: (t, j) => t.profile === 'v_bit' && j.cut === 'engrave',
    prior: PRIOR.best,
    reason: (t) => `A V-bit engraves and V-carves: its included angle${t.vAngleDeg ? ` of ${t.vAngleDeg}°` : ''} sets how wide the line is at each depth.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'v_bit_cannot_cut_walls',
    when: (t, j) => t.profile === 'v_bit' && j.cut !== 'engrave',
    prior: PRIOR.poor,
    hard: true,
    reason: () => 'A V-bit\'s point cannot cut square walls, a flat floor or a round hole: keep it for engraving.',
    sources: [SOURCES.practice],
  },
  {
    id: 'fine_square_end_engraves',
    when: (t, j) => j.cut === 'engrave' && t.profile !== 'v_bit' && t.profile !== 'ball_nose' && t.cuttingDiameterMm <= FINE_ENGRAVING_MM,
    prior: PRIOR.fair,
    reason: (t) => `A ${mm(t.cuttingDiameterMm)} flat-end bit engraves lines of its own width, but without the sharp corners a V-bit gives.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'wide_bit_cannot_engrave',
    when: (t, j) => j.cut === 'engrave' && t.profile !== 'v_bit' && (t.profile === 'ball_nose' || t.cuttingDiameterMm > FINE_ENGRAVING_MM),
    prior: PRIOR.poor,
    reason: (t) => `At ${mm(t.cuttingDiameterMm)} this bit is too wide for lettering; a V-bit engraves by its included angle.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'ball_nose_for_3d',
    when: (t, j) => t.profile === 'ball_nose' && j.cut === 'surface_3d',
    prior: PRIOR.best,
    reason: () => 'A ball-nose follows a 3D surface and leaves small, even scallops between passes.',
    sources: [SOURCES.practice],
  },
  {
    id: 'flat_end_roughs_3d',
    when: (t, j) => STRAIGHT_WALLED.includes(t.profile) && j.cut === 'surface_3d',
    prior: PRIOR.fair,
    reason: () => 'A flat-end bit roughs a 3D surface but leaves steps: finish with a ball-nose.',
    sources: [SOURCES.practice],
  },
  {
    id: 'ball_nose_rounds_walls',
    when: (t, j) => t.profile === 'ball_nose' && CUTS_WITH_WALLS.includes(j.cut),
    prior: PRIOR.poor,
    reason: () => 'A ball-nose leaves a rounded floor and a rounded foot on every wall: a flat-end bit cuts these square.',
    sources: [SOURCES.practice],
  },
  {
    id: 'router_bit_plunges',
    when: (t, j) => j.cut === 'drill' && STRAIGHT_WALLED.includes(t.profile) && t.helix !== 'downcut' && t.helix !== 'compression',
    prior: PRIOR.fair,
    reason: () => 'A router bit plunges a hole of its own size but is no drill: plunge slowly and let the flutes lift the chips.',
    sources: [SOURCES.practice],
  },
  {
    id: 'downcut_packs_holes',
    when: (t, j) => j.cut === 'drill' && (t.helix === 'downcut' || t.helix === 'compression'),
    prior: PRIOR.poor,
    reason: () => 'Plunging with a downcut packs the chips at the bottom of the hole, where they burn and bind the bit.',
    sources: [SOURCES.practice],
  },

  // The material.
  {
    id: 'single_flute_upcut_in_plastic_and_aluminium',
    when: (t, j) => upcutSingle(t) && (PLASTICS.includes(j.family) || METALS.includes(j.family)) && j.cut !== 'engrave',
    prior: PRIOR.best,
    reason: (t, j) => `A single-flute upcut${t.profile === 'o_flute' ? ' O-flute with its polished flute' : ''} takes one large chip and lifts it out of the cut, `
      + `so ${j.materialName} stays cool${heat(j)} and the edge comes out clean.`,
    sources: heatSources([SOURCES.callister]),
  },
  {
    id: 'never_downcut_in_plastic',
    when: (t, j) => (t.helix === 'downcut' || t.helix === 'compression') && PLASTICS.includes(j.family),
    prior: PRIOR.poor,
    hard: true,
    reason: (t, j) => `${helixWord(t)} pushes chips down into the kerf; in ${j.materialName} the next pass re-cuts them and they weld to the edge and the bit${heat(j)}.`,
    sources: heatSources([SOURCES.callister]),
  },
  {
    id: 'two_flute_upcut_in_soft_plastic',
    when: (t, j) => upcutMulti(t) && SOFT_PLASTICS.includes(j.family) && j.cut !== 'engrave',
    prior: PRIOR.fair,
    reason: (t, j) => `A ${t.flutes}-flute upcut cuts ${j.materialName}, a soft plastic, but takes thinner chips and leaves fuzz on the edge: expect minutes of cleanup a part.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'two_flute_upcut_in_hard_plastic',
    when: (t, j) => upcutMulti(t) && j.family === 'hard_plastic' && j.cut !== 'engrave',
    prior: PRIOR.poor,
    reason: (t, j) => `A ${t.flutes}-flute upcut takes chips too thin for ${j.materialName}, a hard plastic: the edge rubs, melts${heat(j)} and comes out poor.`,
    sources: heatSources([SOURCES.callister]),
  },
  {
    id: 'two_flute_upcut_in_aluminium',
    when: (t, j) => upcutMulti(t) && METALS.includes(j.family) && j.cut !== 'engrave',
    prior: PRIOR.fair,
    reason: (t, j) => `A ${t.flutes}-flute upcut cuts ${j.materialName}, but its chips are smaller and clog the flutes sooner than a single flute's.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'no_downcut_in_aluminium',
    when: (t, j) => (t.helix === 'downcut' || t.helix === 'compression') && METALS.includes(j.family),
    prior: PRIOR.poor,
    reason: (t, j) => `${helixWord(t)} packs aluminium chips into the kerf of ${j.materialName}, where they gall the edge and can snap the bit.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'compression_for_two_clean_faces',
    when: (t, j) => t.helix === 'compression' && WOODS.includes(j.family) && j.cut === 'profile',
    prior: PRIOR.best,
    reason: (t, j) => `A compression bit cuts up at the bottom and down at the top, so both faces of ${j.materialName} come out clean: the bit for laminated sheet and plywood.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'compression_in_shallow_cuts',
    when: (t, j) => t.helix === 'compression' && WOODS.includes(j.family) && (j.cut === 'pocket' || j.cut === 'slot'),
    prior: PRIOR.fair,
    reason: () => 'In a pocket or slot only the downcut part of a compression bit touches: the top face is clean, but the chips stay in the cut.',
    sources: [SOURCES.practice],
  },
  {
    id: 'downcut_for_a_clean_top_face',
    when: (t, j) => t.helix === 'downcut' && WOODS.includes(j.family) && CUTS_WITH_WALLS.includes(j.cut),
    prior: PRIOR.good,
    reason: (t, j) => `A downcut leaves a clean top face on ${j.materialName}, when the chips can be cleared: take shallow passes and keep the extraction on the cut.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'upcut_clears_wood',
    when: (t, j) => t.helix === 'upcut' && STRAIGHT_WALLED.includes(t.profile) && WOODS.includes(j.family)
      && (j.family === 'wood' || j.cut === 'pocket' || j.cut === 'slot'),
    prior: PRIOR.good,
    reason: (t, j) => `An upcut lifts the chips out of the cut in ${j.materialName}; the top edge may need a light sanding.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'upcut_chips_laminate_faces',
    when: (t, j) => t.helix === 'upcut' && STRAIGHT_WALLED.includes(t.profile) && j.family === 'sheet_goods' && (j.cut === 'profile' || j.cut === 'drill'),
    prior: PRIOR.fair,
    reason: (t, j) => `An upcut lifts the top face of ${j.materialName} as it cuts: chip-out on laminate and veneer, fuzz on MDF.`,
    sources: [SOURCES.practice],
  },

  // Size against the job.
  {
    id: 'cutting_length_short_of_sheet',
    when: (t, j) => j.cut === 'profile' && j.thicknessMm != null && t.cuttingLengthMm < j.thicknessMm + THROUGH_MARGIN_MM,
    prior: PRIOR.poor,
    hard: true,
    reason: (t, j) => `Its cutting length of ${mm(t.cuttingLengthMm)} is short of the ${mm(j.thicknessMm!)} sheet plus a ${mm(THROUGH_MARGIN_MM)} margin: it cannot cut through, and the shank would rub.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'cutting_length_through',
    when: (t, j) => j.cut === 'profile' && j.thicknessMm != null && t.cuttingLengthMm >= j.thicknessMm + THROUGH_MARGIN_MM,
    prior: null,
    reason: (t, j) => `Its cutting length of ${mm(t.cuttingLengthMm)} reaches through the ${mm(j.thicknessMm!)} sheet with a margin.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'too_wide_for_the_feature',
    when: (t, j) => j.narrowestMm != null && t.profile !== 'v_bit' && t.cuttingDiameterMm > j.narrowestMm,
    prior: PRIOR.poor,
    hard: true,
    reason: (t, j) => `At ${mm(t.cuttingDiameterMm)} it is wider than the narrowest feature of ${mm(j.narrowestMm!)}.`,
    sources: [SOURCES.practice],
  },
  {
    id: 'upcut_lifts_the_sheet',
    when: (t, j) => t.helix === 'upcut' && j.cut === 'profile',
    prior: null,
    reason: () => 'An upcut pulls the sheet up as it cuts through: hold it down (vacuum, clamps, screws) and leave tabs on small parts.',
    sources: [SOURCES.practice],
  },
]

/** What no rule speaks for: a middling prior that the shop's own results soon outweigh. */
export const NO_RULE: Rule = {
  id: 'no_rule',
  when: () => true,
  prior: PRIOR.fair,
  reason: (_t, j) => `No rule of the trade speaks for this type in ${j.materialName}: the shop's own results decide.`,
  sources: [SOURCES.ours],
}

export interface Reason { rule: string, text: string, sources: readonly Source[], prior: number | null, hard: boolean }
export interface RuleVerdict {
  /** The rules' expected share of clean cuts: the lowest prior of the rules that apply. */
  prior: number
  fit: Fit
  /** A rule says the type cannot do this job: it stays a poor fit whatever the logs say. */
  hard: boolean
  /** Worst first, then the notes. */
  reasons: Reason[]
}

export function fitOf(share: number): Fit {
  return share >= FIT_THRESHOLDS.good ? 'good' : share >= FIT_THRESHOLDS.fair ? 'fair' : 'poor'
}

/** The rules' verdict on one type for one job. */
export function judge(t: BitGeometry, job: Job, rules: readonly Rule[] = RULES): RuleVerdict {
  const applied = rules.filter((r) => r.when(t, job))
  const scored = applied.filter((r) => r.prior !== null)
  const used = scored.length ? applied : [NO_RULE, ...applied]
  const reasons = used
    .map((r) => ({ rule: r.id, text: r.reason(t, job), sources: r.sources, prior: r.prior, hard: r.hard === true }))
    .sort((a, b) => (a.prior ?? 2) - (b.prior ?? 2))
  const prior = Math.min(...used.filter((r) => r.prior !== null).map((r) => r.prior!))
  const hard = used.some((r) => r.hard)
  return { prior, fit: hard ? 'poor' : fitOf(prior), hard, reasons }
}

/**
 * The shop's share of clean cuts for a type in a material, pulled toward the rules' prior:
 * with a Beta(prior × n₀, (1 − prior) × n₀) prior and `clean` clean cuts out of `logs`, the
 * posterior is Beta(prior × n₀ + clean, (1 − prior) × n₀ + logs − clean), whose mean is
 * (prior × n₀ + clean) / (n₀ + logs). n₀ = PRIOR_LOGS: the rule counts as that many logs.
 */
export function pulledShare(prior: number, clean: number, logs: number, priorLogs = PRIOR_LOGS) {
  if (!(prior > 0 && prior < 1) || !(priorLogs > 0) || !(logs >= 0) || !(clean >= 0) || clean > logs) {
    throw new RangeError('pulledShare needs 0 < prior < 1, a positive prior weight and 0 ≤ clean ≤ logs')
  }
  const alpha = prior * priorLogs + clean
  const beta = (1 - prior) * priorLogs + (logs - clean)
  return { alpha, beta, mean: alpha / (alpha + beta), weightOfLogs: logs / (logs + priorLogs) }
}

export interface ShopResults {
  /** Cut logs of the type in the material. */
  logs: number
  clean: number
  /** Logs that gave cleanup minutes per part, and their sum. */
  cleanupLogs: number
  cleanupMinutes: number
}
export const NO_RESULTS: ShopResults = { logs: 0, clean: 0, cleanupLogs: 0, cleanupMinutes: 0 }

export interface Ranked<T> {
  item: T
  fit: Fit
  /** The pulled share of clean cuts × 100, to one decimal: the ranking key within a fit. */
  score: number
  verdict: RuleVerdict
  results: { logs: number, cleanShare: number | null, cleanupMinutesPerPart: number | null, cleanupLogs: number }
  /** Where the shop's results moved the fit away from the rules' own. */
  movedBy: 'none' | 'up' | 'down'
}

const round1 = (v: number) => Math.round(v * 10) / 10

/** Ranks the types for a job: good before fair before poor, then by the pulled share of clean
 *  cuts, then by name. Poor fits stay in the list, last, with their reasons. */
export function rankTypes<T extends BitGeometry & { name: string }>(
  types: readonly T[], job: Job, resultsOf: (t: T) => ShopResults = () => NO_RESULTS,
): Ranked<T>[] {
  return types.map((item) => {
    const verdict = judge(item, job)
    const r = resultsOf(item)
    const pulled = pulledShare(verdict.prior, r.clean, r.logs)
    const fit = verdict.hard ? 'poor' : fitOf(pulled.mean)
    const order = FIT_ORDER[fit] - FIT_ORDER[verdict.fit]
    return {
      item, fit, verdict,
      score: round1(pulled.mean * 100),
      results: {
        logs: r.logs,
        cleanShare: r.logs ? r.clean / r.logs : null,
        cleanupMinutesPerPart: r.cleanupLogs ? round1(r.cleanupMinutes / r.cleanupLogs) : null,
        cleanupLogs: r.cleanupLogs,
      },
      movedBy: order < 0 ? 'up' as const : order > 0 ? 'down' as const : 'none' as const,
    }
  }).sort((a, b) => FIT_ORDER[a.fit] - FIT_ORDER[b.fit] || b.score - a.score || a.item.name.localeCompare(b.item.name))
}

/** Sentences for the shop's own results of a type in a material, for the reasons list. */
export function resultsSentence(r: Ranked<unknown>['results'], movedBy: Ranked<unknown>['movedBy'], materialName: string): string | null {
  if (!r.logs) return null
  const share = `${Math.round((r.cleanShare ?? 0) * 100)} % of ${r.logs} logged cut${r.logs === 1 ? '' : 's'} in ${materialName} came out clean`
  const cleanup = r.cleanupMinutesPerPart !== null ? `; cleanup averaged ${r.cleanupMinutesPerPart} min a part over ${r.cleanupLogs} log${r.cleanupLogs === 1 ? '' : 's'}` : ''
  const moved = movedBy === 'up' ? ', which lifts it above the rules\' fit' : movedBy === 'down' ? ', which drops it below the rules\' fit' : ''
  return `This shop: ${share}${cleanup}${moved}.`
}

/** The kind of cut a bit is made for, for judging a bit already chosen (the cutter page). */
export function cutKindFor(profile: Profile): CutKind {
  return profile === 'v_bit' ? 'engrave' : profile === 'ball_nose' ? 'surface_3d' : 'profile'
}
