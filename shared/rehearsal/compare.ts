/**
 * Estimate against rehearsal: each visible line's estimate (the presenter's calibrated model when there is one,
 * else the take's own estimate) beside what each run measured, and the running totals the studio charts.
 */
import type { Outline } from '../schemas/outline'
import type { Calibration, RehearsalRun } from '../schemas/rehearsal'
import { estimateWith, lineWork } from './calibrate'

export interface LineEstimate {
  lineId: number
  /** 1-based among the lines that are said (hidden ones are not) */
  number: number
  text: string
  estimateMs: number
}

/** The lines a presenter says, in order, each with its estimate for this presenter. */
export function lineEstimates(outline: Pick<Outline, 'lines' | 'steps'>, calibration: Calibration | null): LineEstimate[] {
  return outline.lines
    .filter((l) => !l.hidden)
    .map((line, i) => ({
      lineId: line.id,
      number: i + 1,
      text: line.text,
      estimateMs: calibration ? estimateWith(calibration, lineWork(outline, line)) : line.estMs,
    }))
}

interface RunCell {
  ms: number
  isBreak: boolean
}

interface ComparisonRow extends LineEstimate {
  /** one per run, in the runs' order; null where the run didn't reach the line */
  runs: (RunCell | null)[]
}

export interface Comparison {
  rows: ComparisonRow[]
  estimateTotalMs: number
  /** per run: its speech (breaks left out) over the lines of this comparison */
  runTotalsMs: number[]
  /** running totals after each line, for the chart: the estimate's, and each run's (null once a run has stopped) */
  cumulative: { estimate: number[]; runs: (number | null)[][] }
}

/** Lines of the take against each run. A break counts no time: it was not part of the take. */
export function compareRuns(estimates: readonly LineEstimate[], runs: readonly Pick<RehearsalRun, 'lines'>[]): Comparison {
  const byRun = runs.map((run) => new Map(run.lines.map((l) => [l.lineId, { ms: l.ms, isBreak: l.isBreak }])))
  const rows = estimates.map((e) => ({ ...e, runs: byRun.map((m) => m.get(e.lineId) ?? null) }))
  const spoken = (cell: RunCell | null) => (cell && !cell.isBreak ? cell.ms : 0)

  let estimateSum = 0
  const estimate = rows.map((r) => (estimateSum += r.estimateMs))
  const cumulativeRuns = byRun.map((_, k) => {
    const lastReached = rows.reduce((last, r, i) => (r.runs[k] !== null ? i : last), -1)
    let sum = 0
    return rows.map((r, i) => (i > lastReached ? null : (sum += spoken(r.runs[k]))))
  })
  return {
    rows,
    estimateTotalMs: estimateSum,
    runTotalsMs: byRun.map((_, k) => rows.reduce((sum, r) => sum + spoken(r.runs[k]), 0)),
    cumulative: { estimate, runs: cumulativeRuns },
  }
}
