/**
 * Linear least squares, plain and robust, for small problems (a handful of unknowns, a few thousand rows):
 * normal equations solved by Gaussian elimination with partial pivoting. No DOM, no Node.
 */

/** Solves A·x = b for a square A; null when A is singular (a column carries no information of its own). */
function solveLinear(a: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const n = b.length
  const m = a.map((row, i) => [...row, b[i]])
  const scale = Math.max(1e-300, ...m.flat().map(Math.abs))
  for (let col = 0; col < n; col++) {
    let pivot = col
    for (let r = col + 1; r < n; r++) if (Math.abs(m[r][col]) > Math.abs(m[pivot][col])) pivot = r
    if (Math.abs(m[pivot][col]) <= scale * 1e-12) return null
    ;[m[col], m[pivot]] = [m[pivot], m[col]]
    for (let r = col + 1; r < n; r++) {
      const f = m[r][col] / m[col][col]
      for (let c = col; c <= n; c++) m[r][c] -= f * m[col][c]
    }
  }
  const x = new Array<number>(n).fill(0)
  for (let r = n - 1; r >= 0; r--) {
    let sum = m[r][n]
    for (let c = r + 1; c < n; c++) sum -= m[r][c] * x[c]
    x[r] = sum / m[r][r]
  }
  return x
}

/** Minimises Σ wᵢ (yᵢ − xᵢ·β)² over β; null when the columns of X don't determine β. */
export function weightedLeastSquares(x: readonly (readonly number[])[], y: readonly number[], w: readonly number[] = y.map(() => 1)): number[] | null {
  const p = x[0]?.length ?? 0
  if (p === 0) return null
  const xtwx = Array.from({ length: p }, () => new Array<number>(p).fill(0))
  const xtwy = new Array<number>(p).fill(0)
  x.forEach((row, i) => {
    for (let j = 0; j < p; j++) {
      xtwy[j] += w[i] * row[j] * y[i]
      for (let k = 0; k < p; k++) xtwx[j][k] += w[i] * row[j] * row[k]
    }
  })
  return solveLinear(xtwx, xtwy)
}

/** Huber's tuning constant: 95% efficiency when the errors are normal (Huber 1964; common practice). */
const HUBER_K = 1.345
// MAD / 0.6745 estimates a normal distribution's standard deviation (common practice)
const MAD_TO_SIGMA = 1 / 0.6745
const MAX_ITERATIONS = 50

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b)
  const mid = s.length >> 1
  return s.length % 2 ? s[mid] : (s[mid - 1] + s[mid]) / 2
}

/**
 * Huber regression by iteratively reweighted least squares: rows whose residual is more than HUBER_K robust
 * standard deviations (MAD of the residuals) off get weight k·σ/|r|, so one line where the presenter stopped to
 * think pulls the fit far less than it would pull plain least squares. Starts from the plain fit.
 */
export function huberFit(x: readonly (readonly number[])[], y: readonly number[]): { beta: number[]; weights: number[] } | null {
  let weights = y.map(() => 1)
  let beta = weightedLeastSquares(x, y, weights)
  if (!beta) return null
  for (let it = 0; it < MAX_ITERATIONS; it++) {
    const fitted = beta
    const residuals = x.map((row, i) => y[i] - row.reduce((sum, v, j) => sum + v * fitted[j], 0))
    const sigma = median(residuals.map(Math.abs)) * MAD_TO_SIGMA
    // (nearly) every row on the line already: nothing is an outlier
    if (sigma <= 1e-9 * Math.max(1, ...y.map(Math.abs))) break
    const cut = HUBER_K * sigma
    weights = residuals.map((r) => (Math.abs(r) <= cut ? 1 : cut / Math.abs(r)))
    const next = weightedLeastSquares(x, y, weights)
    if (!next) return null
    const moved = Math.max(...next.map((b, j) => Math.abs(b - fitted[j]) / Math.max(1, Math.abs(fitted[j]))))
    beta = next
    if (moved < 1e-9) break
  }
  return { beta, weights }
}
