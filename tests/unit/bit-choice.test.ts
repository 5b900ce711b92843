// The bit chooser's rules of the trade (each with its reason and its source), the polymer
// temperatures some of them lean on, the ranking with few and many logs, and the Bayesian pull of
// the shop's results toward the rules' prior, checked by hand and against a numerical posterior.
import { describe, expect, it } from 'vitest'
import jstat from 'jstat'
import {
  CUT_KINDS, FIT_THRESHOLDS, NO_RULE, PRIOR, PRIOR_LOGS, RULES, SOURCES, THROUGH_MARGIN_MM,
  fitOf, judge, pulledShare, rankTypes, resultsSentence, type BitGeometry, type Job, type ShopResults,
} from '../../shared/kerf/bit-choice'
import { POLYMERS, heatLimit, polymerOf } from '../../shared/kerf/polymers'

const { jStat } = jstat as unknown as { jStat: {
  beta: { pdf(x: number, a: number, b: number): number }
  binomial: { pdf(k: number, n: number, p: number): number }
} }

// Bits as a shop's catalogue holds them (invented, sizes in mm).
const OFLUTE: BitGeometry = { profile: 'o_flute', helix: 'upcut', flutes: 1, cuttingDiameterMm: 6.35, cuttingLengthMm: 22.2, vAngleDeg: null }
const UP2: BitGeometry = { profile: 'square_end', helix: 'upcut', flutes: 2, cuttingDiameterMm: 6.35, cuttingLengthMm: 25.4, vAngleDeg: null }
const DOWN2: BitGeometry = { ...UP2, helix: 'downcut' }
const COMP: BitGeometry = { ...UP2, helix: 'compression', cuttingLengthMm: 22.2 }
const VBIT: BitGeometry = { profile: 'v_bit', helix: 'straight', flutes: 2, cuttingDiameterMm: 12.7, cuttingLengthMm: 11, vAngleDeg: 60 }
const BALL: BitGeometry = { profile: 'ball_nose', helix: 'upcut', flutes: 2, cuttingDiameterMm: 6.35, cuttingLengthMm: 25.4, vAngleDeg: null }

const CAST: Job = { family: 'hard_plastic', materialName: 'Cast acrylic', cut: 'profile' }
const HDPE: Job = { family: 'soft_plastic', materialName: 'HDPE', cut: 'profile' }
const PLY: Job = { family: 'sheet_goods', materialName: 'Plywood', cut: 'profile' }
const OAK: Job = { family: 'wood', materialName: 'Hardwood', cut: 'pocket' }
const ALU: Job = { family: 'non_ferrous', materialName: 'Aluminium 6061', cut: 'profile' }

const rulesOf = (t: BitGeometry, job: Job) => judge(t, job).reasons.map((r) => r.rule)

describe('the rules are data, each with a reason and a source', () => {
  it('every rule has an id of its own, a reason for a sample job and at least one source', () => {
    expect(new Set(RULES.map((r) => r.id)).size).toBe(RULES.length)
    for (const r of RULES) {
      expect(r.sources.length, r.id).toBeGreaterThan(0)
      expect(r.reason(UP2, { ...PLY, thicknessMm: 18, narrowestMm: 6 }).length, r.id).toBeGreaterThan(20)
    }
  })

  it('the trade facts are common practice; the rules that quote a plastic\'s temperature also name the textbook', () => {
    const job = { ...HDPE, thicknessMm: 12, narrowestMm: 6 }
    const quoting = RULES.filter((r) => [OFLUTE, DOWN2].some((t) => / (melts|softens) /.test(r.reason(t, job))))
    expect(quoting.map((r) => r.id).sort()).toEqual(['never_downcut_in_plastic', 'single_flute_upcut_in_plastic_and_aluminium', 'two_flute_upcut_in_hard_plastic'])
    for (const r of quoting) expect(r.sources).toContain(SOURCES.callister)
    for (const r of RULES) expect(r.sources).toContain(SOURCES.practice)
    // What no rule speaks for rests on our own figure, and says so.
    expect(NO_RULE.sources).toEqual([SOURCES.ours])
  })
})

describe('polymer temperatures', () => {
  it('are Callister\'s appendix values for PMMA, HDPE, PC and PVC', () => {
    // W. D. Callister, Materials Science and Engineering, appendix table of polymer Tg and Tm:
    // HDPE Tg -90 °C, Tm 137 °C; polycarbonate Tg 150 °C, Tm 265 °C; PVC Tg 87 °C, Tm 212 °C;
    // PMMA amorphous, Tg about 105 °C.
    const by = Object.fromEntries(POLYMERS.map((p) => [p.key, [p.tgC, p.tmC]]))
    expect(by).toEqual({ pmma: [105, null], hdpe: [-90, 137], pc: [150, 265], pvc: [87, 212] })
  })

  it('are found from the names shops give their materials', () => {
    expect(polymerOf('Cast acrylic')?.key).toBe('pmma')
    expect(polymerOf('Extruded acrylic')?.key).toBe('pmma')
    expect(polymerOf('HDPE')?.key).toBe('hdpe')
    expect(polymerOf('Polycarbonate')?.key).toBe('pc')
    expect(polymerOf('PVC foam board')?.key).toBe('pvc')
    expect(polymerOf('MDF')).toBeNull()
    expect(heatLimit(polymerOf('HDPE')!)).toBe('HDPE melts at 137 °C')
    expect(heatLimit(polymerOf('Cast acrylic')!)).toBe('acrylic (PMMA) softens above about 105 °C')
  })
})

describe('the trade\'s rules (common practice)', () => {
  it('prefers a single-flute upcut O-flute in plastics and aluminium, and says why with the melting point', () => {
    for (const job of [CAST, HDPE, ALU]) expect(judge(OFLUTE, job).fit, job.materialName).toBe('good')
    const reason = judge(OFLUTE, HDPE).reasons[0]!
    expect(reason.rule).toBe('single_flute_upcut_in_plastic_and_aluminium')
    expect(reason.text).toContain('polished flute')
    expect(reason.text).toContain('HDPE melts at 137 °C')
  })

  it('never takes a downcut or compression bit in plastic, whatever it is', () => {
    for (const t of [DOWN2, COMP]) {
      for (const job of [CAST, HDPE, { ...HDPE, family: 'foam' as const, materialName: 'PVC foam board' }]) {
        const v = judge(t, job)
        expect(v.fit).toBe('poor')
        expect(v.hard).toBe(true)
        expect(v.reasons[0]!.text).toMatch(/weld/)
      }
    }
  })

  it('takes a two-flute upcut as fair in soft plastic (with cleanup) and poor in hard plastic', () => {
    const soft = judge(UP2, HDPE)
    expect(soft.fit).toBe('fair')
    expect(soft.reasons[0]!.text).toMatch(/fuzz.*cleanup/)
    const hard = judge(UP2, CAST)
    expect(hard.fit).toBe('poor')
    expect(hard.hard).toBe(false)
    expect(hard.reasons[0]!.text).toMatch(/melts/)
  })

  it('prefers compression for through cuts in plywood and laminated sheet, and a downcut for a clean top face in wood', () => {
    const ranked = rankTypes([{ ...UP2, name: 'up' }, { ...DOWN2, name: 'down' }, { ...COMP, name: 'comp' }], PLY)
    expect(ranked.map((r) => [r.item.name, r.fit])).toEqual([['comp', 'good'], ['down', 'good'], ['up', 'fair']])
    expect(judge(COMP, PLY).reasons[0]!.text).toMatch(/both faces/)
    expect(judge(DOWN2, OAK).reasons.find((r) => r.rule === 'downcut_for_a_clean_top_face')!.text).toMatch(/chips can be cleared/)
  })

  it('engraves with V-bits by included angle and keeps them out of cuts with walls', () => {
    const engrave = judge(VBIT, { ...CAST, cut: 'engrave' })
    expect(engrave.fit).toBe('good')
    expect(engrave.reasons[0]!.text).toContain('60°')
    for (const cut of CUT_KINDS.filter((c) => c !== 'engrave')) {
      expect(judge(VBIT, { ...PLY, cut }).fit, cut).toBe('poor')
    }
    expect(judge(UP2, { ...PLY, cut: 'engrave' }).fit).toBe('poor')
    expect(judge({ ...UP2, cuttingDiameterMm: 3.175 }, { ...PLY, cut: 'engrave' }).fit).toBe('fair')
  })

  it('takes a ball-nose for 3D surfaces and not for square walls', () => {
    expect(judge(BALL, { ...OAK, cut: 'surface_3d' }).fit).toBe('good')
    expect(judge(UP2, { ...OAK, cut: 'surface_3d' }).fit).toBe('fair')
    expect(judge(BALL, OAK).fit).toBe('poor')
  })

  it('needs a cutting length of at least the sheet plus the margin for a through cut', () => {
    // 22.2 mm of flute: 21.2 mm of sheet is exactly the limit with the 1 mm margin.
    expect(THROUGH_MARGIN_MM).toBe(1)
    expect(judge(OFLUTE, { ...CAST, thicknessMm: 21.2 }).fit).toBe('good')
    expect(rulesOf(OFLUTE, { ...CAST, thicknessMm: 21.2 })).toContain('cutting_length_through')
    const short = judge(OFLUTE, { ...CAST, thicknessMm: 21.3 })
    expect(short.fit).toBe('poor')
    expect(short.hard).toBe(true)
    expect(short.reasons[0]!.text).toContain('cannot cut through')
    // A pocket does not go through: the sheet's thickness does not limit it.
    expect(judge(OFLUTE, { ...CAST, cut: 'pocket', thicknessMm: 40 }).fit).toBe('good')
  })

  it('keeps a bit wider than the narrowest feature out, when the shop gives the feature', () => {
    expect(judge(OFLUTE, { ...CAST, narrowestMm: 6.35 }).fit).toBe('good')
    const wide = judge(OFLUTE, { ...CAST, narrowestMm: 6 })
    expect([wide.fit, wide.hard]).toEqual(['poor', true])
  })

  it('reminds about hold-downs and tabs when an upcut cuts through, without changing the fit', () => {
    const v = judge(OFLUTE, CAST)
    const note = v.reasons.find((r) => r.rule === 'upcut_lifts_the_sheet')!
    expect(note.prior).toBeNull()
    expect(note.text).toMatch(/hold it down.*tabs/)
    expect(v.reasons.at(-1)!.rule).toBe('upcut_lifts_the_sheet')
    expect(rulesOf(OFLUTE, { ...CAST, cut: 'pocket' })).not.toContain('upcut_lifts_the_sheet')
  })

  it('says so when no rule speaks for a type, and leaves it fair', () => {
    const straight: BitGeometry = { ...UP2, helix: 'straight' }
    const v = judge(straight, CAST)
    expect(v.fit).toBe('fair')
    expect(v.reasons[0]!.rule).toBe('no_rule')
    expect(v.reasons[0]!.text).toContain('shop\'s own results decide')
  })

  it('reads levels off the prior with the stated thresholds', () => {
    expect([fitOf(FIT_THRESHOLDS.good), fitOf(FIT_THRESHOLDS.good - 1e-9), fitOf(FIT_THRESHOLDS.fair), fitOf(FIT_THRESHOLDS.fair - 1e-9)])
      .toEqual(['good', 'fair', 'fair', 'poor'])
    expect([fitOf(PRIOR.best), fitOf(PRIOR.good), fitOf(PRIOR.fair), fitOf(PRIOR.poor)]).toEqual(['good', 'good', 'fair', 'poor'])
  })
})

describe('the Bayesian pull toward the rules\' prior', () => {
  it('matches the example worked by hand in docs/domain.md', () => {
    // Prior: a fair fit expects 65 % clean cuts, worth 20 logs: Beta(13, 7).
    // The shop logs 40 cuts of the type in the material, 10 clean: Beta(13 + 10, 7 + 30) = Beta(23, 37),
    // mean 23 / 60 = 0.38333..., a poor fit; the logs carry 40 / 60 of the weight.
    expect(PRIOR.fair).toBe(0.65)
    expect(PRIOR_LOGS).toBe(20)
    const p = pulledShare(0.65, 10, 40)
    expect(p.alpha).toBeCloseTo(23, 12)
    expect(p.beta).toBeCloseTo(37, 12)
    expect(p.mean).toBeCloseTo(23 / 60, 12)
    expect(p.weightOfLogs).toBeCloseTo(2 / 3, 12)
    expect(fitOf(p.mean)).toBe('poor')
  })

  it('is the mean of the posterior found by integrating prior × binomial likelihood numerically (jStat)', () => {
    // Bayes' rule by quadrature, with jStat's Beta density and binomial mass as independent pieces.
    for (const [prior, clean, logs] of [[0.65, 10, 40], [0.88, 3, 3], [0.3, 45, 50], [0.92, 0, 5]] as const) {
      const a = prior * PRIOR_LOGS
      const b = (1 - prior) * PRIOR_LOGS
      const steps = 20_000
      let mass = 0
      let first = 0
      for (let i = 0; i < steps; i++) {
        const x = (i + 0.5) / steps
        const w = jStat.beta.pdf(x, a, b) * jStat.binomial.pdf(clean, logs, x)
        mass += w
        first += w * x
      }
      expect(pulledShare(prior, clean, logs).mean).toBeCloseTo(first / mass, 6)
    }
  })

  it('stays at the prior with no logs and goes to the shop\'s own share as logs pile up', () => {
    expect(pulledShare(0.88, 0, 0).mean).toBeCloseTo(0.88, 12)
    const many = pulledShare(0.88, 2000, 10_000).mean
    expect(Math.abs(many - 0.2)).toBeLessThan(0.002)
  })

  it('refuses impossible counts', () => {
    expect(() => pulledShare(0.5, 3, 2)).toThrow(RangeError)
    expect(() => pulledShare(1, 0, 0)).toThrow(RangeError)
    expect(() => pulledShare(0.5, -1, 2)).toThrow(RangeError)
  })
})

describe('the ranking with few and many logs', () => {
  const types = [{ ...OFLUTE, name: 'O-flute 1/4' }, { ...UP2, name: 'Two-flute upcut 1/4' }, { ...DOWN2, name: 'Downcut 1/4' }]
  const results = (by: Record<string, ShopResults>) => (t: { name: string }) => by[t.name] ?? { logs: 0, clean: 0, cleanupLogs: 0, cleanupMinutes: 0 }

  it('with no logs, ranks by the rules: single flute, then two-flute upcut, then the downcut last with why', () => {
    const ranked = rankTypes(types, HDPE)
    expect(ranked.map((r) => [r.item.name, r.fit, r.score])).toEqual([
      ['O-flute 1/4', 'good', 92], ['Two-flute upcut 1/4', 'fair', 65], ['Downcut 1/4', 'poor', 30],
    ])
    expect(ranked[2]!.verdict.reasons[0]!.text).toMatch(/weld/)
    expect(ranked.every((r) => r.results.logs === 0 && r.results.cleanShare === null && r.movedBy === 'none')).toBe(true)
  })

  it('with a few bad logs, the rules\' rank stands', () => {
    // Three fuzzy O-flute cuts: (18.4 + 0) / 23 = 0.8 clean, still good and still first.
    const ranked = rankTypes(types, HDPE, results({ 'O-flute 1/4': { logs: 3, clean: 0, cleanupLogs: 3, cleanupMinutes: 12 } }))
    expect(ranked[0]!.item.name).toBe('O-flute 1/4')
    expect(ranked[0]!.fit).toBe('good')
    expect(ranked[0]!.score).toBe(80)
    expect(ranked[0]!.results).toEqual({ logs: 3, cleanShare: 0, cleanupMinutesPerPart: 4, cleanupLogs: 3 })
  })

  it('with many logs, the shop\'s results move the rank', () => {
    const ranked = rankTypes(types, HDPE, results({
      'O-flute 1/4': { logs: 60, clean: 30, cleanupLogs: 30, cleanupMinutes: 150 },
      'Two-flute upcut 1/4': { logs: 80, clean: 78, cleanupLogs: 0, cleanupMinutes: 0 },
    }))
    // Two-flute: (13 + 78) / 100 = 0.91, good; O-flute: (18.4 + 30) / 80 = 0.605, fair.
    expect(ranked.map((r) => [r.item.name, r.fit, r.score, r.movedBy])).toEqual([
      ['Two-flute upcut 1/4', 'good', 91, 'up'], ['O-flute 1/4', 'fair', 60.5, 'down'], ['Downcut 1/4', 'poor', 30, 'none'],
    ])
    expect(resultsSentence(ranked[1]!.results, ranked[1]!.movedBy, 'HDPE'))
      .toBe('This shop: 50 % of 60 logged cuts in HDPE came out clean; cleanup averaged 5 min a part over 30 logs, which drops it below the rules\' fit.')
  })

  it('never lifts a bit that cannot do the job, however clean its logs', () => {
    const ranked = rankTypes(types, HDPE, results({ 'Downcut 1/4': { logs: 500, clean: 500, cleanupLogs: 0, cleanupMinutes: 0 } }))
    const down = ranked.find((r) => r.item.name === 'Downcut 1/4')!
    expect(down.fit).toBe('poor')
    expect(ranked.at(-1)).toBe(down)
  })
})
