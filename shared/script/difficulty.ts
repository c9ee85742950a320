/**
 * The difficulty guard: where a script asks too much of its viewers. Two signs, both measured on the
 * timeline the viewer sees (hidden lines take no time): what-if narration taking more than a fifth
 * of the video, and stretches of more than three minutes in which no digit is placed.
 */
import type { Outline } from '../schemas/outline'
import { timeline } from './timing'

/** What-if narration above this share of the script's time is flagged. */
export const WHAT_IF_SHARE_MAX = 0.2
/** A stretch longer than this without a digit placed is flagged. */
export const DRY_SPELL_MAX_MS = 3 * 60_000

interface DrySpell {
  /** the first and last visible lines of the stretch */
  fromLineId: number
  toLineId: number
  startMs: number
  durationMs: number
}

interface DifficultyReport {
  totalMs: number
  whatIfMs: number
  /** whatIfMs / totalMs, 0 for an empty script */
  whatIfShare: number
  /** the what-if lines, longest first, so the studio can point at them */
  whatIfLineIds: number[]
  tooManyWhatIfs: boolean
  drySpells: DrySpell[]
}

export function difficultyReport(outline: Pick<Outline, 'lines' | 'chapters' | 'trim' | 'steps'>): DifficultyReport {
  const t = timeline(outline)
  const byId = new Map(t.lines.map((l) => [l.id, l]))
  let whatIfMs = 0
  const whatIfs: { id: number; ms: number }[] = []
  const drySpells: DrySpell[] = []
  let spell: { from: number; to: number; start: number; end: number } | null = null
  const close = () => {
    if (spell && spell.end - spell.start > DRY_SPELL_MAX_MS) {
      drySpells.push({ fromLineId: spell.from, toLineId: spell.to, startMs: spell.start, durationMs: spell.end - spell.start })
    }
    spell = null
  }
  for (const line of outline.lines) {
    const timed = byId.get(line.id)
    if (!timed || timed.hidden) continue
    if (line.steps.some((k) => outline.steps[k].facts.kind === 'contradiction')) {
      whatIfMs += timed.durationMs
      whatIfs.push({ id: line.id, ms: timed.durationMs })
    }
    // the intro and outro aren't part of the solve: a dry spell is counted between digits
    if (line.kind !== 'step') {
      close()
      continue
    }
    const places = line.steps.some((k) => outline.steps[k].placements.length > 0)
    if (places) {
      // the digit lands during the line, so the spell runs on to the start of it
      if (spell) spell.end = timed.startMs
      close()
      continue
    }
    if (!spell) spell = { from: line.id, to: line.id, start: timed.startMs, end: timed.endMs }
    else {
      spell.to = line.id
      spell.end = timed.endMs
    }
  }
  close()
  const whatIfShare = t.totalMs > 0 ? whatIfMs / t.totalMs : 0
  return {
    totalMs: t.totalMs,
    whatIfMs,
    whatIfShare,
    whatIfLineIds: whatIfs.sort((a, b) => b.ms - a.ms).map((w) => w.id),
    tooManyWhatIfs: whatIfShare > WHAT_IF_SHARE_MAX,
    drySpells,
  }
}
