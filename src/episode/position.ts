/** Where a viewer is in a published episode: which line plays at a time, and how far the solve has got by then. */
import { cellName } from '@shared/grid'
import type { EpisodeLine, EpisodePage } from '@shared/schemas/episode'

/** The line playing at `ms`: the last one starting at or before it; -1 before the first line starts. */
export function lineAt(lines: readonly Pick<EpisodeLine, 'startMs'>[], ms: number): number {
  let found = -1
  for (let i = 0; i < lines.length; i++) {
    if (lines[i]!.startMs > ms) break
    found = i
  }
  return found
}

/** How many engine steps are done once lines 0..index have been said (0 before any line). */
export function stepsThrough(lines: readonly Pick<EpisodeLine, 'steps'>[], index: number): number {
  let done = 0
  for (let i = 0; i <= index && i < lines.length; i++) for (const s of lines[i]!.steps) done = Math.max(done, s + 1)
  return done
}

/** The digits a line puts in, as "r3c4 = 7" in step order. */
export function placementsOf(page: Pick<EpisodePage, 'steps'>, line: Pick<EpisodeLine, 'steps'>): string[] {
  return line.steps.flatMap((i) => page.steps[i]?.placements.map((p) => `${cellName(p.cell)} = ${p.digit}`) ?? [])
}
