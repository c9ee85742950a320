import { describe, expect, test } from 'vitest'
import { DEFAULT_MODEL, calibrate, estimateWith, type TimedWork } from '../../../shared/rehearsal/calibrate'
import { huberFit, weightedLeastSquares } from '../../../shared/rehearsal/least-squares'
import type { LineWork } from '../../../shared/schemas/rehearsal'

const work = (words: number, placements = 0, marks = 0, whatIfMoves = 0): LineWork => ({ words, placements, marks, whatIfMoves })

/** A small seeded generator (mulberry32, a well-known public-domain PRNG), so the synthetic runs are the same every time. */
function seeded(seed: number): () => number {
  let a = seed >>> 0
  return () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
}

describe('least squares', () => {
  test('a straight line through four points, computed by hand', () => {
    // By hand: x̄ = 25, ȳ = 9750, Sxy = 145 000, Sxx = 500 → slope 290, intercept 9750 − 290·25 = 2500.
    const beta = weightedLeastSquares([[10, 1], [20, 1], [30, 1], [40, 1]], [5000, 9000, 11000, 14000])
    expect(beta![0]).toBeCloseTo(290, 9)
    expect(beta![1]).toBeCloseTo(2500, 9)
  })

  test('Huber weights: the point farthest off is down-weighted by k·σ/|r| (hand-computed first round)', () => {
    // Residuals of the plain fit above: −400, 700, −200, −100. Median |r| = 300, σ = 300 / 0.6745 = 444.78,
    // cut = 1.345 σ = 598.22 (Huber 1964's k; common practice): only the 700 is past it, weight 598.22 / 700 = 0.8546.
    // Each later round moves the line towards the other three, so that point's weight only falls further.
    const fit = huberFit([[10, 1], [20, 1], [30, 1], [40, 1]], [5000, 9000, 11000, 14000])!
    expect(fit.weights[1]).toBeLessThan(0.8547)
    expect(fit.weights.filter((w) => w < 1)).toHaveLength(1)
    // with the point above the line counting less, the line tilts towards the other three: a steeper slope
    expect(fit.beta[0]).toBeGreaterThan(290)
  })

  test('columns that carry no information of their own give no answer', () => {
    expect(weightedLeastSquares([[1, 2], [2, 4], [3, 6]], [1, 2, 3])).toBeNull()
  })
})

describe('calibrate', () => {
  test('hand-computed: lines that fit 150 wpm, 1.5 s a digit and a 1 s pause exactly', () => {
    // 150 wpm is 400 ms a word. Line times: 10 words → 4000 + 1000 = 5000; 20 words, 1 digit → 8000 + 1500 + 1000 = 10 500; …
    const lines: TimedWork[] = [
      { work: work(10), ms: 5000 },
      { work: work(20, 1), ms: 10_500 },
      { work: work(15, 2), ms: 10_000 },
      { work: work(30), ms: 13_000 },
      { work: work(5, 3), ms: 7500 },
    ]
    const model = calibrate(lines)!
    expect(model.pace).toBeCloseTo(150, 6)
    expect(model.placementMs).toBeCloseTo(1500, 6)
    expect(model.pauseMs).toBeCloseTo(1000, 6)
    // no line marks a candidate or takes a what-if: those keep the script's constants
    expect(model.markMs).toBe(DEFAULT_MODEL.markMs)
    expect(model.whatIfMoveMs).toBe(DEFAULT_MODEL.whatIfMoveMs)
  })

  test('synthetic runs of a presenter at 183 wpm: the fit recovers the pace within 2%, despite noise and a few long thinks', () => {
    const truth = { pace: 183, placementMs: 1300, markMs: 420, whatIfMoveMs: 900, pauseMs: 650 }
    const random = seeded(15)
    const lines: TimedWork[] = Array.from({ length: 240 }, (_, i) => {
      const w = work(4 + Math.floor(random() * 60), Math.floor(random() * 4), Math.floor(random() * 8), random() < 0.15 ? Math.floor(random() * 7) : 0)
      // people vary line to line: ±8% speech, and now and then (1 line in 20) a stop to think of 10–40 s
      const jitter = 1 + (random() - 0.5) * 0.16
      const think = i % 20 === 7 ? 10_000 + random() * 30_000 : 0
      return { work: w, ms: Math.round(estimateWith(truth, w) * jitter + think) }
    })
    const model = calibrate(lines)!
    expect(Math.abs(model.pace - truth.pace) / truth.pace).toBeLessThan(0.02)
    expect(model.placementMs).toBeGreaterThan(0)
    expect(model.markMs).toBeGreaterThan(0)
  })

  test('too few lines keep the constants', () => {
    expect(calibrate([{ work: work(10), ms: 4000 }])).toBeNull()
  })

  test('a presenter who talks faster than the allowed 400 wpm is held at 400', () => {
    const lines = [10, 20, 30, 40, 50].map((n) => ({ work: work(n), ms: n * 100 + 500 }))
    expect(calibrate(lines)!.pace).toBe(400)
  })

  test('an action the fit would make negative is held at 0', () => {
    // more digits, a little less time: a presenter who places while talking; the rest still fits 200 wpm (300 ms a word)
    const lines = [
      { work: work(10, 0), ms: 3800 },
      { work: work(20, 2), ms: 6700 },
      { work: work(30, 1), ms: 9790 },
      { work: work(40, 3), ms: 12_700 },
      { work: work(25, 0), ms: 8300 },
      { work: work(15, 1), ms: 5290 },
    ]
    const model = calibrate(lines)!
    expect(model.placementMs).toBe(0)
    expect(model.pace).toBeGreaterThan(180)
  })
})
