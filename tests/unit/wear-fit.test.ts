// Learned wear factors: synthetic histories made with known factors must give them back. The
// solver is non-negative least squares, checked by its optimality (Karush-Kuhn-Tucker)
// conditions as stated in Lawson & Hanson, "Solving Least Squares Problems", 1974 (from memory).
import { Matrix } from 'ml-matrix'
import { describe, expect, it } from 'vitest'
import { confidenceFor, fitWear, nnlsNormal, type FinishedLife } from '../../shared/kerf/wear-fit'

/** mulberry32, a small public-domain 32-bit PRNG (from memory): the same lives on every run. */
function prng(seed: number) {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

const TRUE = new Map([[1, 0.5], [2, 1.0], [3, 1.6], [4, 2.4]])
const STARTING = [1, 2, 3, 4].map((id) => ({ materialId: id, startingFactor: 1 }))

/** Lives that each end when the true damage reaches 1 × noise (uniform within ±noise). */
function syntheticLives(count: number, noise: number, seed = 7): FinishedLife[] {
  const rand = prng(seed)
  const lives: FinishedLife[] = []
  for (let n = 0; n < count; n++) {
    const ratedLifeMinutes = rand() < 0.5 ? 600 : 900
    const lifeScale = rand() < 0.6 ? 1 : 0.8
    const ids = [...TRUE.keys()].filter(() => rand() < 0.5)
    if (!ids.length) ids.push(1 + Math.floor(rand() * 4))
    const shares = ids.map(() => 0.2 + rand())
    const total = shares.reduce((a, b) => a + b, 0)
    const damage = 1 + noise * (2 * rand() - 1)
    lives.push({
      ratedLifeMinutes, lifeScale,
      cuts: ids.map((id, i) => ({ materialId: id, minutes: (shares[i]! / total) * damage * ratedLifeMinutes * lifeScale / TRUE.get(id)! })),
    })
  }
  return lives
}

describe('learning wear factors from finished lives', () => {
  it('recovers known factors within 5 % from 400 noisy lives (±15 % on when each life ended)', () => {
    const fit = fitWear(syntheticLives(400, 0.15), STARTING)
    for (const m of fit) {
      expect(Math.abs(m.learnedFactor / TRUE.get(m.materialId)! - 1)).toBeLessThan(0.05)
      expect(m.confidence).toBe('good')
    }
  })

  it('recovers them almost exactly without noise', () => {
    const fit = fitWear(syntheticLives(200, 0), STARTING, { priorLives: 1e-6 })
    for (const m of fit) expect(m.learnedFactor).toBeCloseTo(TRUE.get(m.materialId)!, 6)
  })

  it('counts the lives and minutes behind each material', () => {
    const lives = syntheticLives(30, 0.1, 3)
    const fit = fitWear(lives, STARTING)
    for (const m of fit) {
      const touching = lives.filter((l) => l.cuts.some((c) => c.materialId === m.materialId))
      expect(m.lives).toBe(touching.length)
      const minutes = touching.flatMap((l) => l.cuts).filter((c) => c.materialId === m.materialId).reduce((s, c) => s + c.minutes, 0)
      expect(m.minutes).toBeCloseTo(minutes, 9)
    }
  })

  it('with no history returns the starting factors, with no data behind them', () => {
    const starting = [{ materialId: 9, startingFactor: 1.25 }, { materialId: 10, startingFactor: 0.4 }]
    expect(fitWear([], starting)).toEqual([
      { materialId: 9, startingFactor: 1.25, learnedFactor: 1.25, lives: 0, minutes: 0, confidence: 'no data' },
      { materialId: 10, startingFactor: 0.4, learnedFactor: 0.4, lives: 0, minutes: 0, confidence: 'no data' },
    ])
  })

  it('one life pulls a material part of the way from its starting factor; many lives carry it', () => {
    // One life of 300 min at rated 600 says the factor is 2; the prior says 1.
    const one: FinishedLife = { ratedLifeMinutes: 600, lifeScale: 1, cuts: [{ materialId: 1, minutes: 300 }] }
    const starting = [{ materialId: 1, startingFactor: 1 }]
    const [thin] = fitWear([one], starting)
    expect(thin!.learnedFactor).toBeGreaterThan(1)
    expect(thin!.learnedFactor).toBeLessThan(2)
    expect(thin!.confidence).toBe('thin: 1 life')
    const [many] = fitWear(Array(200).fill(one), starting)
    expect(many!.learnedFactor).toBeCloseTo(2, 1)
  })

  it('a reground life counts at its shorter length', () => {
    // 240 min at rated 600 × 0.8 = 480 sharp minutes: factor 2.
    const reground: FinishedLife = { ratedLifeMinutes: 600, lifeScale: 0.8, cuts: [{ materialId: 1, minutes: 240 }] }
    const [m] = fitWear(Array(500).fill(reground), [{ materialId: 1, startingFactor: 1 }])
    expect(m!.learnedFactor).toBeCloseTo(2, 1)
  })

  it('never learns a negative factor', () => {
    // Lives in 1 alone say 1.0; lives mixing 1 and 2 are over by material 1 alone: 2 would go negative.
    const lives: FinishedLife[] = [
      ...Array(50).fill({ ratedLifeMinutes: 100, lifeScale: 1, cuts: [{ materialId: 1, minutes: 100 }] }),
      ...Array(50).fill({ ratedLifeMinutes: 100, lifeScale: 1, cuts: [{ materialId: 1, minutes: 120 }, { materialId: 2, minutes: 50 }] }),
    ]
    const fit = fitWear(lives, [{ materialId: 1, startingFactor: 1 }, { materialId: 2, startingFactor: 0.5 }], { priorLives: 1e-6 })
    expect(fit[1]!.learnedFactor).toBe(0)
    expect(fit[0]!.learnedFactor).toBeGreaterThan(0)
  })

  it('says how much history backs a figure in plain words', () => {
    expect([0, 1, 4, 5, 19, 20].map(confidenceFor)).toEqual(['no data', 'thin: 1 life', 'thin: 4 lives', 'fair', 'fair', 'good'])
  })
})

describe('non-negative least squares (Lawson & Hanson active set, normal-equation form)', () => {
  it('meets the optimality conditions: w ≥ 0, gradient 0 where w > 0 and ≤ 0 where w = 0', () => {
    const rand = prng(42)
    for (let trial = 0; trial < 20; trial++) {
      const A = Matrix.rand(12, 5, { random: () => rand() - 0.3 })
      const b = Matrix.columnVector(Array.from({ length: 12 }, () => rand() - 0.5))
      const G = A.transpose().mmul(A).add(Matrix.eye(5).mul(1e-9))
      const h = A.transpose().mmul(b).getColumn(0)
      const w = nnlsNormal(G, h)
      const grad = h.map((hi, i) => hi - G.getRow(i).reduce((s, g, j) => s + g * w[j]!, 0))
      w.forEach((wi, i) => {
        expect(wi).toBeGreaterThanOrEqual(0)
        if (wi > 0) expect(Math.abs(grad[i]!)).toBeLessThan(1e-8)
        else expect(grad[i]!).toBeLessThanOrEqual(1e-8)
      })
    }
  })

  it('equals the plain solution when that is already non-negative', () => {
    const G = new Matrix([[2, 1], [1, 3]])
    // G⁻¹ h for h = (3, 4): (1, 1).
    const [a, b] = nnlsNormal(G, [3, 4])
    expect(a).toBeCloseTo(1, 12)
    expect(b).toBeCloseTo(1, 12)
  })
})
