/**
 * Chapters: made automatically from the solve's segments, and as they are published.
 */
import type { Chapter, Outline, OutlineLine } from '../schemas/outline'
import type { ScriptSource } from './narrate'
import { segmentSteps } from './segments'
import { timeline } from './timing'

/** Chapters: the rules, then one per segment of the solve, each at the line where it begins. */
export function autoChapters(src: ScriptSource, lines: OutlineLine[]): Chapter[] {
  const chapters: Chapter[] = [{ lineId: lines[0].id, title: 'The rules', edited: false }]
  for (const seg of segmentSteps(src.steps, src.puzzle.thermometers)) {
    const line = lines.find((l) => l.steps.includes(seg.start))
    if (!line || chapters.some((c) => c.lineId === line.id)) continue
    chapters.push({ lineId: line.id, title: seg.title, edited: false })
  }
  return chapters
}

interface PublishedChapter {
  title: string
  startMs: number
  endMs: number
}

/**
 * Chapters as they are published: the first from 0:00, empty ones (all lines hidden) dropped,
 * and no two in the same second, since a description can't tell them apart.
 */
export function publishedChapters(outline: Outline): PublishedChapter[] {
  const t = timeline(outline)
  const out: PublishedChapter[] = []
  t.chapters.forEach((c, i) => {
    const startMs = i === 0 ? 0 : c.startMs
    if (c.endMs <= startMs) return
    const prev = out[out.length - 1]
    if (prev && Math.floor(startMs / 1000) <= Math.floor(prev.startMs / 1000)) return
    if (prev) prev.endMs = startMs
    out.push({ title: c.title, startMs, endMs: c.endMs })
  })
  return out
}

