// Learned wear as a lifetime model with censoring (docs/domain.md computation 4
// "Learned wear"). Every sharp life of a cutter is evidence: one that ended by wear failed at the
// damage it reached, D = Σ_m minutes_m · w_m / (rated life × life scale × ρ_type); one still
// running, broken, lost or retired for another reason is right-censored there. Log D of a worn-out
// life is normal around 0 with scatter σ (a lognormal life). We estimate the wear factors w_m
// (all but the reference material's, which is the unit), the rated-life ratio ρ of each cutter
// type and σ by maximum likelihood on the log scale, with a prior that pulls each factor toward
// the shop's starting figure (and each ratio toward 1) with the weight of a stated number of
// lives. Newton's method on our own likelihood; ml-matrix does the linear algebra. Pure.
import { CholeskyDecomposition, Matrix, inverse } from 'ml-matrix'
import jStatModule from 'jstat'

const { jStat } = jStatModule as unknown as { jStat: { normal: { cdf: (x: number, m: number, s: number) => number } } }

export interface LifeCut { materialId: number, minutes: number }

export interface SharpLife {
  typeId: number
  /** Rated life × life scale in force during this life, in minutes. */
  ratedLifeMinutes: number
  /** Ended by wear (dull, reground, retired worn or undersize); otherwise censored. */
  wornOut: boolean
  /** The minutes cut in each material. */
  cuts: readonly LifeCut[]
}

/**
 * Lives laid out in columns, as the server reads them from its roll-up (no object a life): life i
 * is `typeId[i]`, `ratedLifeMinutes[i]`, `wornOut[i]` (1 or 0), and cut `minutes[q]` in material
 * `materialId[q]` for q from `start[i]` up to `start[i + 1]`.
 */
export interface LifeColumns {
  typeId: Int32Array
  ratedLifeMinutes: Float64Array
  wornOut: Uint8Array
  /** One more entry than lives: where each life's cuts begin, then where the last one's end. */
  start: Int32Array
  materialId: Int32Array
  minutes: Float64Array
}

/** A list of lives laid out in columns. */
export function lifeColumns(lives: readonly SharpLife[]): LifeColumns {
  let cuts = 0
  for (const life of lives) cuts += life.cuts.length
  const out: LifeColumns = {
    typeId: new Int32Array(lives.length), ratedLifeMinutes: new Float64Array(lives.length), wornOut: new Uint8Array(lives.length),
    start: new Int32Array(lives.length + 1), materialId: new Int32Array(cuts), minutes: new Float64Array(cuts),
  }
  let q = 0
  lives.forEach((life, i) => {
    out.typeId[i] = life.typeId
    out.ratedLifeMinutes[i] = life.ratedLifeMinutes
    out.wornOut[i] = life.wornOut ? 1 : 0
    for (const cut of life.cuts) { out.materialId[q] = cut.materialId; out.minutes[q++] = cut.minutes }
    out.start[i + 1] = q
  })
  return out
}

export interface StartingFactor { materialId: number, startingFactor: number }

export interface WearModelOptions {
  /** Lives' worth of the prior: the starting figure weighs as much as this many lives cut wholly in the material. 0 switches every prior off (pure maximum likelihood). */
  priorLives?: number
  /** The scatter the prior pulls toward (σ of log life). */
  priorScatter?: number
  /** The material whose factor is the unit; by default the one whose starting factor is nearest 1 (the first on a tie). */
  referenceMaterialId?: number
}

export interface Estimate { value: number, interval: [number, number] | null }

export interface MaterialWear {
  materialId: number
  startingFactor: number
  learnedFactor: number
  interval: [number, number] | null
  lives: number
  finishedLives: number
  censoredLives: number
  minutes: number
  reference: boolean
  /** Other materials (ids) the data cannot tell apart from this one. */
  group: number[]
  /** Those of `group` that every life cut in the same proportion with this one. */
  together: number[]
  /** Types (ids) whose rated-life ratio the data cannot tell apart from this factor. */
  typeGroup: number[]
  tooFewLives: boolean
  disagrees: boolean
}

export interface TypeLife {
  typeId: number
  ratedLifeRatio: number
  interval: [number, number] | null
  finishedLives: number
  censoredLives: number
}

export interface WearModel {
  materials: MaterialWear[]
  types: TypeLife[]
  /** σ of log life, with its interval; null when no life ended by wear (or none at all). */
  scatter: Estimate | null
  referenceMaterialId: number | null
  converged: boolean
  iterations: number
  /** Log-likelihood of the data alone at the estimate (without the prior and without the constant −½ log 2π per failure). */
  logLikelihood: number
}

/** Lives cut wholly in a material that the starting figure is worth. One such life moves the log factor a third of the way. */
export const DEFAULT_PRIOR_LIVES = 2
/** σ = 0.4 is a coefficient of variation of about 0.42: solid-carbide router bits scatter that much (common practice). */
export const DEFAULT_PRIOR_SCATTER = 0.4
/** Fewer finished lives than this make a figure "too few lives". */
export const FAIR_LIVES = 5
/** The 90 % two-sided normal quantile (the standard normal quantile at 0.95, computed: 1.6448536). */
const Z90 = 1.6448536269514722
/** Starting figures outside the 99 % interval of the fit disagree strongly with the data. */
const Z99 = 2.5758293035489004
/** Two estimates whose correlation passes this are reported as one group: the data tell only their combination. */
export const TOLD_APART_CORRELATION = 0.8
/** Columns of the data this close to parallel are "always cut together", however many lives. */
const PARALLEL = 0.999
/** An interval wider than this ratio (high ÷ low) asks before it is adopted. */
export const WIDE_INTERVAL_RATIO = 1.5

export function isWide(interval: readonly [number, number] | null): boolean {
  return !interval || interval[1] / interval[0] > WIDE_INTERVAL_RATIO
}

/** The material whose factor is the unit: starting factor nearest 1, the first of the list on a tie. */
export function referenceMaterial(materials: readonly StartingFactor[]): number | null {
  let best: StartingFactor | null = null
  for (const m of materials) if (!best || Math.abs(Math.log(m.startingFactor)) < Math.abs(Math.log(best.startingFactor)) - 1e-12) best = m
  return best?.materialId ?? null
}

function isColumns(lives: readonly SharpLife[] | LifeColumns): lives is LifeColumns {
  return !Array.isArray(lives)
}

export function fitWearModel(lives: readonly SharpLife[] | LifeColumns, materials: readonly StartingFactor[], options: WearModelOptions = {}): WearModel {
  const k = options.priorLives ?? DEFAULT_PRIOR_LIVES
  const sigma0 = options.priorScatter ?? DEFAULT_PRIOR_SCATTER
  for (const m of materials) if (!(m.startingFactor > 0)) throw new RangeError('starting factors must be positive')
  const column = new Map(materials.map((m, i) => [m.materialId, i]))
  const refId = options.referenceMaterialId ?? referenceMaterial(materials)
  const ref = refId === null ? -1 : (column.get(refId) ?? -1)
  const nm = materials.length
  const data = isColumns(lives) ? lives : lifeColumns(lives)
  const logStart = materials.map((m) => Math.log(m.startingFactor))

  // Counts, and the lives that carry information (a life with no minutes says nothing). Each
  // life's minutes are summed by material into `scratch` and kept in column order, so that the
  // sums over pairs of a life's columns below run over one triangle.
  const typeIndex = new Map<number, number>()
  const finishedBy = new Int32Array(nm), censoredBy = new Int32Array(nm), minutesBy = new Float64Array(nm)
  const typeFinished: number[] = [], typeCensored: number[] = []
  const livesIn = data.typeId.length
  const lifeStart = new Int32Array(livesIn + 1), types = new Int32Array(livesIn), failed = new Uint8Array(livesIn)
  const cols = new Int32Array(data.materialId.length), shares = new Float64Array(data.materialId.length)
  let nLives = 0, used = 0, finishedTotal = 0
  const scratch = new Float64Array(nm)
  const touched = new Int32Array(nm)
  for (let i = 0; i < livesIn; i++) {
    const rated = data.ratedLifeMinutes[i]!
    if (!(rated > 0)) throw new RangeError('a life needs a positive rated life')
    let n = 0
    for (let q = data.start[i]!, q1 = data.start[i + 1]!; q < q1; q++) {
      const j = column.get(data.materialId[q]!)
      if (j === undefined) throw new RangeError(`material ${data.materialId[q]} has no starting factor`)
      const minutes = data.minutes[q]!
      if (!(minutes > 0)) continue
      if (scratch[j] === 0) {
        // Insert j in order (a life touches a handful of materials).
        let x = n++
        for (; x > 0 && touched[x - 1]! > j; x--) touched[x] = touched[x - 1]!
        touched[x] = j
      }
      scratch[j]! += minutes
    }
    if (!n) continue
    const worn = data.wornOut[i] !== 0
    let t = typeIndex.get(data.typeId[i]!)
    if (t === undefined) { t = typeIndex.size; typeIndex.set(data.typeId[i]!, t); typeFinished.push(0); typeCensored.push(0) }
    if (worn) { typeFinished[t]!++; finishedTotal++ } else typeCensored[t]!++
    for (let x = 0; x < n; x++) {
      const j = touched[x]!
      if (worn) finishedBy[j]!++
      else censoredBy[j]!++
      minutesBy[j]! += scratch[j]!
      cols[used] = j
      shares[used++] = scratch[j]! / rated
      scratch[j] = 0
    }
    types[nLives] = t
    failed[nLives++] = worn ? 1 : 0
    lifeStart[nLives] = used
  }
  // Each cut as its column and its minutes ÷ the life's rated life.
  const col = cols.subarray(0, used), share = shares.subarray(0, used)
  const nt = typeIndex.size

  // Parameters: log w of each material with lives (but the reference), log ρ of each type, log σ.
  // Numbered in column order, so a life's parameters come in increasing order too.
  const param = new Int32Array(nm).fill(-1)
  const paramMaterial: number[] = []
  for (let j = 0; j < nm; j++) if (j !== ref && finishedBy[j]! + censoredBy[j]! > 0) { param[j] = paramMaterial.length; paramMaterial.push(j) }
  const pw = paramMaterial.length
  const ps = pw + nt // index of log σ
  const np = ps + 1

  const usable = nLives > 0 && (finishedTotal > 0 || k > 0)
  const theta = new Float64Array(np)
  paramMaterial.forEach((j, i) => { theta[i] = logStart[j]! })
  theta[ps] = Math.log(sigma0)

  // How parallel the data's columns are: Σ over lives of the products of the minutes' shares
  // (at the starting factors) of every material and of each type (1 on its lives). Exactly
  // parallel columns are materials "always cut together", however many lives there are.
  // Summed over the upper triangle (a life's columns are in order, its type's last), then mirrored.
  const cosN = nm + nt
  const cross = new Float64Array(cosN * cosN)
  {
    const wStart = Float64Array.from(logStart, Math.exp)
    // A life's shares and their columns, side by side.
    const pc = new Float64Array(nm + 1)
    const ic = new Int32Array(nm + 1)
    for (let i = 0; i < nLives; i++) {
      const q0 = lifeStart[i]!, q1 = lifeStart[i + 1]!
      let A = 0
      for (let q = q0; q < q1; q++) A += share[q]! * wStart[col[q]!]!
      let m = 0
      for (let q = q0; q < q1; q++) { const j = col[q]!; pc[m] = share[q]! * wStart[j]! / A; ic[m++] = j }
      pc[m] = 1
      ic[m++] = nm + types[i]!
      for (let x = 0; x < m; x++) {
        const pa = pc[x]!, row = ic[x]! * cosN
        for (let y = x; y < m; y++) cross[row + ic[y]!]! += pa * pc[y]!
      }
    }
    for (let a = 0; a < cosN; a++) for (let b = a + 1; b < cosN; b++) cross[b * cosN + a] = cross[a * cosN + b]!
  }
  const wNow = new Float64Array(nm)
  // A life's damage shares and the parameters they belong to, side by side.
  const p = new Float64Array(nm)
  const idx = new Int32Array(nm)

  /**
   * Log-likelihood of every `stride`-th life (scaled up by `stride`), and when asked its gradient
   * and Hessian in θ (flat, np × np).
   */
  const evaluate = (th: Float64Array, stride: number, grad: Float64Array | null, hess: Float64Array | null) => {
    for (let j = 0; j < nm; j++) wNow[j] = Math.exp(param[j]! >= 0 ? th[param[j]!]! : logStart[j]!)
    const s = th[ps]!
    const sigma = Math.exp(s)
    const inv = 1 / sigma
    let ll = 0
    for (let i = 0; i < nLives; i += stride) {
      const q0 = lifeStart[i]!, q1 = lifeStart[i + 1]!
      let A = 0
      for (let q = q0; q < q1; q++) A += share[q]! * wNow[col[q]!]!
      const t = pw + types[i]!
      const u = Math.log(A) - th[t]!
      const z = u * inv
      let lu: number, luu: number, ls: number, lss: number, lus: number
      if (failed[i]) {
        ll += -s - 0.5 * z * z
        if (!grad) continue
        lu = -z * inv; luu = -inv * inv; ls = -1 + z * z; lss = -2 * z * z; lus = 2 * z * inv
      } else {
        // λ(z) = φ(z) / (1 − Φ(z)) and log(1 − Φ(z)); past z = 3 by the continued fraction of
        // the Mills ratio, where the difference 1 − Φ loses its digits.
        const logPhi = -0.5 * z * z - 0.9189385332046727
        let h: number
        if (z > 3) {
          let cf = z
          for (let n = 40; n >= 1; n--) cf = z + n / cf
          h = cf
          ll += logPhi - Math.log(cf)
        } else {
          const survival = jStat.normal.cdf(-z, 0, 1)
          h = Math.exp(logPhi) / survival
          ll += Math.log(survival)
        }
        if (!grad) continue
        const d = h * (h - z)
        lu = -h * inv; luu = -d * inv * inv; ls = h * z; lss = -h * z * (1 + z * (h - z)); lus = h * (1 + z * (h - z)) * inv
      }
      // ∂u/∂log w_j = p_j (the life's damage share in j), ∂u/∂log ρ = −1; ∇²u = diag(p) − ppᵀ.
      let n = 0
      for (let q = q0; q < q1; q++) {
        const j = col[q]!
        const a = param[j]!
        if (a >= 0) { p[n] = share[q]! * wNow[j]! / A; idx[n++] = a }
      }
      grad[t]! -= lu
      grad[ps]! += ls
      const H = hess!
      H[t * np + t]! += luu
      H[t * np + ps]! -= lus
      H[ps * np + ps]! += lss
      const c = luu - lu
      for (let x = 0; x < n; x++) {
        const a = idx[x]!
        const pa = p[x]!
        grad[a]! += lu * pa
        H[a * np + ps]! += lus * pa
        H[a * np + t]! -= luu * pa
        H[a * np + a]! += lu * pa
        const row = a * np
        const cp = c * pa
        // The upper triangle only (idx is in increasing order); `curvature` mirrors it.
        for (let y = x; y < n; y++) H[row + idx[y]!]! += cp * p[y]!
      }
    }
    if (stride > 1) {
      ll *= stride
      if (grad) for (let a = 0; a < np; a++) grad[a]! *= stride
      if (hess) for (let a = 0; a < np * np; a++) hess[a]! *= stride
    }
    return ll
  }

  // The prior's weight is measured in lives at the fitted scatter: precision k / σ² on each log
  // factor and log ratio (σ taken from the previous step, so the prior never argues for a wider
  // scatter), and k lives' worth (2k) on log σ toward σ₀.
  let priorSigma = sigma0
  const penalty = (th: Float64Array, grad?: Float64Array, hess?: Float64Array) => {
    if (k <= 0) return 0
    const e2 = 1 / (priorSigma * priorSigma)
    let pen = 0
    for (let a = 0; a < ps; a++) {
      const d = th[a]! - (a < pw ? logStart[paramMaterial[a]!]! : 0)
      pen += 0.5 * k * d * d * e2
      if (grad && hess) { grad[a]! -= k * d * e2; hess[a * np + a]! -= k * e2 }
    }
    const ds = th[ps]! - Math.log(sigma0)
    pen += k * ds * ds
    if (grad && hess) { grad[ps]! -= 2 * k * ds; hess[ps * np + ps]! -= 2 * k }
    return pen
  }

  /** The negative Hessian of the log posterior as a symmetric ml-matrix Matrix, with the gradient. */
  const curvature = (th: Float64Array, stride: number) => {
    const grad = new Float64Array(np)
    const hess = new Float64Array(np * np)
    // `evaluate` fills the upper triangle only (materials, then types, then σ); it mirrors here.
    const value = evaluate(th, stride, grad, hess) - penalty(th, grad, hess)
    const H = new Matrix(np, np)
    for (let a = 0; a < np; a++) for (let b = a; b < np; b++) { H.set(a, b, -hess[a * np + b]!); H.set(b, a, -hess[a * np + b]!) }
    return { value, grad, H }
  }

  // Newton's method on the log posterior with a backtracking line search; where the Hessian is not
  // negative definite it is shifted (Levenberg) until it is. Returns whether it converged.
  let lastH: Matrix | null = null
  // With `followScatter` the prior's σ follows each step (a fixed-point iteration, which converges
  // linearly); without it the objective is fixed and Newton converges quadratically, so a step
  // under `tolerance` leaves an error of about its square and the loop stops there.
  const newton = (stride: number, tolerance: number, maxIterations: number, followScatter: boolean) => {
    for (let it = 0; it < maxIterations; it++) {
      iterations++
      if (followScatter) priorSigma = Math.exp(theta[ps]!)
      const { value, grad, H } = curvature(theta, stride)
      lastH = H
      let shift = 0
      let chol = new CholeskyDecomposition(H)
      const scale = Math.max(1, ...Array.from({ length: np }, (_, a) => Math.abs(H.get(a, a))))
      while (!chol.isPositiveDefinite() && shift < 1e8 * scale) {
        shift = shift ? shift * 10 : 1e-6 * scale
        const Hs = H.clone()
        for (let a = 0; a < np; a++) Hs.set(a, a, H.get(a, a) + shift)
        chol = new CholeskyDecomposition(Hs)
      }
      if (!chol.isPositiveDefinite()) return false
      const step = chol.solve(Matrix.columnVector(Array.from(grad))).to1DArray()
      const maxStep = Math.max(...step.map(Math.abs))
      let size = maxStep > 2 ? 2 / maxStep : 1
      const next = new Float64Array(np)
      let accepted = false
      // Close to the peak with a positive-definite Hessian a full Newton step is taken as it is.
      if (!followScatter && shift === 0 && maxStep < 0.01) { next.set(theta); for (let a = 0; a < np; a++) next[a]! += step[a]!; accepted = true }
      for (let tries = 0; tries < 40 && !accepted; tries++) {
        for (let a = 0; a < np; a++) next[a] = theta[a]! + size * step[a]!
        const v = evaluate(next, stride, null, null) - penalty(next)
        if (Number.isFinite(v) && v >= value - 1e-12 * Math.abs(value)) { accepted = true; break }
        size /= 2
      }
      if (!accepted) return shift === 0 && Math.max(...Array.from(grad, Math.abs)) < 1e-6
      theta.set(next)
      if (maxStep * size < tolerance) return true
    }
    return false
  }

  let converged = !usable
  let iterations = 0
  let covariance: Matrix | null = null
  if (usable) {
    // First with the prior's σ following the fit, on every tenth life (scaled up) of a large
    // history, to get close; then, with that σ fixed, Newton on all the lives until a step is under
    // 1e-4 (what is left is of the order of 1e-8, far below the three decimals shown). The
    // curvature of that last step gives the intervals.
    const stride = Math.floor(nLives / 3000)
    if (stride >= 10) newton(10 * stride, 1e-2, 50, true)
    newton(Math.max(1, stride), stride > 1 ? 1e-3 : 1e-7, 100, true)
    converged = newton(1, 1e-4, 100, false)
    const H = converged && lastH ? lastH as Matrix : curvature(theta, 1).H
    if (new CholeskyDecomposition(H).isPositiveDefinite()) covariance = inverse(H)
  }

  const sd = (a: number) => (covariance ? Math.sqrt(Math.max(0, covariance.get(a, a))) : NaN)
  const interval = (a: number, center: number): [number, number] | null =>
    Number.isFinite(sd(a)) ? [Math.exp(center - Z90 * sd(a)), Math.exp(center + Z90 * sd(a))] : null
  const correlation = (a: number, b: number) => (covariance ? covariance.get(a, b) / (sd(a) * sd(b)) : 0)

  // How parallel two columns of the data are (cosine of their damage shares over the lives),
  // the reference material included: "always cut together" whatever the number of lives.
  const parallel = usable ? cosines(cross, cosN) : null

  const groupOf: number[][] = materials.map(() => [])
  const togetherOf: number[][] = materials.map(() => [])
  const typeGroupOf: number[][] = materials.map(() => [])
  const typeIds = [...typeIndex.keys()]
  const together = (a: number, b: number) => parallel !== null && parallel[a * cosN + b]! >= PARALLEL
  for (let j = 0; j < nm; j++) {
    if (finishedBy[j]! + censoredBy[j]! === 0) continue
    for (let l = j + 1; l < nm; l++) {
      if (finishedBy[l]! + censoredBy[l]! === 0) continue
      const strong = param[j]! >= 0 && param[l]! >= 0 && Math.abs(correlation(param[j]!, param[l]!)) >= TOLD_APART_CORRELATION
      if (strong || together(j, l)) { groupOf[j]!.push(materials[l]!.materialId); groupOf[l]!.push(materials[j]!.materialId) }
      if (together(j, l)) { togetherOf[j]!.push(materials[l]!.materialId); togetherOf[l]!.push(materials[j]!.materialId) }
    }
    // The reference's factor is fixed, so the types' ratios are measured against it, not confused with it.
    for (let t = 0; t < nt && j !== ref; t++) {
      const strong = param[j]! >= 0 && Math.abs(correlation(param[j]!, pw + t)) >= TOLD_APART_CORRELATION
      if (strong || together(j, nm + t)) typeGroupOf[j]!.push(typeIds[t]!)
    }
  }

  const result: MaterialWear[] = materials.map((m, j) => {
    const a = param[j]!
    const learned = a >= 0 && usable ? Math.exp(theta[a]!) : m.startingFactor
    const iv = a >= 0 ? interval(a, theta[a]!) : null
    const disagrees = a >= 0 && Number.isFinite(sd(a)) && Math.abs(logStart[j]! - theta[a]!) > Z99 * sd(a)
    return {
      materialId: m.materialId,
      startingFactor: m.startingFactor,
      learnedFactor: learned,
      interval: iv,
      lives: finishedBy[j]! + censoredBy[j]!,
      finishedLives: finishedBy[j]!,
      censoredLives: censoredBy[j]!,
      minutes: minutesBy[j]!,
      reference: j === ref,
      group: groupOf[j]!,
      together: togetherOf[j]!,
      typeGroup: typeGroupOf[j]!,
      tooFewLives: j !== ref && finishedBy[j]! < FAIR_LIVES,
      disagrees,
    }
  })
  return {
    materials: result,
    types: typeIds.map((typeId, t) => ({
      typeId,
      ratedLifeRatio: usable ? Math.exp(theta[pw + t]!) : 1,
      interval: usable ? interval(pw + t, theta[pw + t]!) : null,
      finishedLives: typeFinished[t]!,
      censoredLives: typeCensored[t]!,
    })),
    scatter: usable && finishedTotal > 0 ? { value: Math.exp(theta[ps]!), interval: interval(ps, theta[ps]!) } : null,
    referenceMaterialId: refId,
    converged,
    iterations,
    logLikelihood: usable ? evaluate(theta, 1, null, null) : 0,
  }
}

/** Cosines between the data's columns (every material's damage share, then each type's 1), over the lives. */
function cosines(g: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n * n)
  for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) {
    const d = Math.sqrt(g[a * n + a]! * g[b * n + b]!)
    out[a * n + b] = d > 0 ? g[a * n + b]! / d : 0
  }
  return out
}
