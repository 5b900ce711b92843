// Learned wear factors (docs/domain.md, computation 4): every finished sharp life should have used
// exactly one life, Σ_m minutes_m · w_m / (rated life · life scale) = 1, so the shop's history
// gives one equation per life. We solve for non-negative per-material rates w by least squares,
// pulled toward the starting factors (ridge toward the prior) so that a material few lives
// touch keeps close to the shop's own figure. Pure: no framework or database imports.
import { Matrix, solve } from 'ml-matrix'

export interface LifeCut { materialId: number, minutes: number }

/** One finished sharp life: dulled, reground or retired for wear (never a breakage). */
export interface FinishedLife {
  ratedLifeMinutes: number
  /** 1 for a new cutter's life, the regrind life fraction for a reground one. */
  lifeScale: number
  cuts: readonly LifeCut[]
}

export interface StartingFactor { materialId: number, startingFactor: number }

export type Confidence = 'no data' | `thin: ${number} ${'life' | 'lives'}` | 'fair' | 'good'

export interface LearnedWear {
  materialId: number
  startingFactor: number
  learnedFactor: number
  /** Finished lives that cut this material at all. */
  lives: number
  minutes: number
  confidence: Confidence
}

export interface WearFitOptions {
  /** How hard the starting factor pulls, in lives' worth of evidence (see `fitWear`). */
  priorLives?: number
}

export const DEFAULT_PRIOR_LIVES = 2
const FAIR_LIVES = 5
const GOOD_LIVES = 20

/** Plain words for how much history backs a learned factor. */
export function confidenceFor(lives: number): Confidence {
  if (lives <= 0) return 'no data'
  if (lives < FAIR_LIVES) return `thin: ${lives} ${lives === 1 ? 'life' : 'lives'}`
  return lives < GOOD_LIVES ? 'fair' : 'good'
}

/**
 * Non-negative least squares on the normal equations: minimise ½wᵀGw − hᵀw subject to w ≥ 0,
 * G symmetric positive definite. The active-set method of Lawson & Hanson (1974), in the
 * normal-equation form of Bro & de Jong (1997). Each step solves the free variables' system
 * with ml-matrix.
 */
export function nnlsNormal(G: Matrix, h: readonly number[], tol = 1e-12): number[] {
  const n = h.length
  const w = Array<number>(n).fill(0)
  const passive = new Set<number>()
  const gradient = () => h.map((hi, i) => hi - G.getRow(i).reduce((s, g, j) => s + g * w[j]!, 0))
  const solvePassive = () => {
    const idx = [...passive].sort((a, b) => a - b)
    const s = Array<number>(n).fill(0)
    if (!idx.length) return s
    const sub = new Matrix(idx.map((i) => idx.map((j) => G.get(i, j))))
    const x = solve(sub, Matrix.columnVector(idx.map((i) => h[i]!)))
    idx.forEach((i, k) => { s[i] = x.get(k, 0) })
    return s
  }

  for (let outer = 0; outer < 3 * n + 10; outer++) {
    const grad = gradient()
    let best = -1
    for (let j = 0; j < n; j++) if (!passive.has(j) && grad[j]! > tol && (best < 0 || grad[j]! > grad[best]!)) best = j
    if (best < 0) break
    passive.add(best)
    let s = solvePassive()
    // Step back toward the feasible region while a free variable would go negative.
    for (let inner = 0; inner < 3 * n + 10 && [...passive].some((i) => s[i]! <= 0); inner++) {
      let alpha = 1
      for (const i of passive) if (s[i]! <= 0) alpha = Math.min(alpha, w[i]! / (w[i]! - s[i]!))
      for (let i = 0; i < n; i++) w[i] = w[i]! + alpha * (s[i]! - w[i]!)
      for (const i of [...passive]) if (w[i]! <= tol) { passive.delete(i); w[i] = 0 }
      s = solvePassive()
    }
    for (let i = 0; i < n; i++) w[i] = passive.has(i) ? s[i]! : 0
  }
  return w
}

/**
 * Fits per-material wear rates w minimising ‖Aw − 1‖² + Σ_m λ_m (w_m − prior_m)², w ≥ 0, where
 * row i of A holds life i's minutes in each material over its rated life × life scale.
 * λ_m = priorLives × (material m's average share of AᵀA per life that cut it): the starting
 * factor weighs as much as `priorLives` of the material's own lives, whatever its scale and however
 * its lives mix materials. So one life moves a factor a third of the way (with the default 2) and
 * two hundred lives carry it. A material no life touched keeps its starting factor exactly.
 */
export function fitWear(lives: readonly FinishedLife[], materials: readonly StartingFactor[], options: WearFitOptions = {}): LearnedWear[] {
  const k = options.priorLives ?? DEFAULT_PRIOR_LIVES
  const n = materials.length
  const column = new Map(materials.map((m, i) => [m.materialId, i]))
  // AᵀA in a flat array while the lives stream past (ml-matrix's get/set is slow in a hot loop).
  const ata = new Float64Array(n * n)
  const h = Array<number>(n).fill(0)
  const livesBy = Array<number>(n).fill(0)
  const minutesBy = Array<number>(n).fill(0)

  // One life's row of A, sparse: the columns it touched and their values (scratch reused).
  const rowValue = new Float64Array(n)
  const touched: number[] = []
  for (const life of lives) {
    if (!(life.ratedLifeMinutes > 0) || !(life.lifeScale > 0)) throw new RangeError('a life needs a positive rated life and life scale')
    const scale = life.ratedLifeMinutes * life.lifeScale
    for (const cut of life.cuts) {
      const j = column.get(cut.materialId)
      if (j === undefined) throw new RangeError(`material ${cut.materialId} has no starting factor`)
      if (!(cut.minutes > 0)) continue
      if (rowValue[j] === 0) touched.push(j)
      rowValue[j]! += cut.minutes / scale
      minutesBy[j]! += cut.minutes
    }
    // Accumulate AᵀA and Aᵀ1 a row at a time: the history never has to sit in memory as A.
    for (const i of touched) {
      const ai = rowValue[i]!
      livesBy[i]! += 1
      h[i]! += ai
      for (const j of touched) ata[i * n + j]! += ai * rowValue[j]!
    }
    for (const i of touched) rowValue[i] = 0
    touched.length = 0
  }
  const G = new Matrix(Array.from({ length: n }, (_, i) => Array.from(ata.subarray(i * n, (i + 1) * n))))
  materials.forEach((m, i) => {
    if (!(m.startingFactor > 0)) throw new RangeError('starting factors must be positive')
    const perLife = livesBy[i] ? G.get(i, i) / livesBy[i]! : 1 / m.startingFactor ** 2
    const lambda = k * perLife
    G.set(i, i, G.get(i, i) + lambda)
    h[i]! += lambda * m.startingFactor
  })

  const w = nnlsNormal(G, h)
  return materials.map((m, i) => ({
    materialId: m.materialId,
    startingFactor: m.startingFactor,
    // A material no finished life touched keeps its own figure, untouched by rounding noise.
    learnedFactor: livesBy[i] ? w[i]! : m.startingFactor,
    lives: livesBy[i]!,
    minutes: minutesBy[i]!,
    confidence: confidenceFor(livesBy[i]!),
  }))
}
