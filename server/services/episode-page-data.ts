/**
 * The public page's data from an episode's snapshot: what the viewer reads, timed on the published video.
 * Pure: the service fetches the row and decides who may see it, this turns it into an EpisodePage.
 */
import type { EpisodeChapter, EpisodeLine, EpisodePage, EpisodePlayer } from '../../shared/schemas/episode'
import type { Outline } from '../../shared/schemas/outline'
import { timeline, type Timeline } from '../../shared/script/index'
import type { EpisodePageRow } from '../db/episodes'

/** Where the page's files are, each with the grant a members-only episode's addresses carry. */
export interface EpisodeAddresses {
  media: string
  captions: string
  picture: string
}

/** The EpisodePage of a snapshot; `player` is worked out by the caller (it may need the recording's row). */
export function episodePageData(row: EpisodePageRow, player: EpisodePlayer, addresses: EpisodeAddresses): EpisodePage {
  const outline = row.snapshot
  const times = timeline(outline)
  const lines = visibleLines(outline, times)
  return {
    channel: { name: row.channel_name, slug: row.channel_slug },
    episode: { slug: row.slug, title: row.title, description: row.description, visibility: row.visibility, publishAt: row.publish_at.toISOString() },
    puzzle: {
      title: outline.title,
      ...(outline.author ? { setter: outline.author } : {}),
      ...(outline.link ? { link: outline.link } : {}),
      rules: rulesOf(outline),
      givens: outline.puzzle.givens,
      thermometers: outline.puzzle.thermometers,
    },
    steps: outline.steps,
    lines,
    chapters: chaptersOf(outline, times),
    timing: times.source === 'aligned' ? 'aligned' : 'estimated',
    durationMs: Math.round(times.totalMs),
    player,
    ...(player.kind === 'media' ? { captionsUrl: addresses.captions } : {}),
    pictureUrl: addresses.picture,
  }
}

function visibleLines(outline: Outline, times: Timeline): EpisodeLine[] {
  const startOf = new Map(times.lines.map((t) => [t.id, t.startMs]))
  return outline.lines
    .filter((line) => !line.hidden)
    .map((line) => ({ id: line.id, kind: line.kind, text: line.text, steps: line.steps, startMs: Math.round(startOf.get(line.id) ?? 0) }))
}

/**
 * The chapters a viewer can jump to: the first from 0:00, those whose lines are all hidden dropped, and one
 * starting at a hidden line moved to the first shown line after it (it starts at the same time).
 */
function chaptersOf(outline: Outline, times: Timeline): EpisodeChapter[] {
  const order = outline.lines
  const shownFrom = (lineId: number): number | undefined => order.slice(order.findIndex((l) => l.id === lineId)).find((l) => !l.hidden)?.id
  const chapters: EpisodeChapter[] = []
  times.chapters.forEach((chapter, i) => {
    const startMs = i === 0 ? 0 : Math.round(chapter.startMs)
    const lineId = shownFrom(chapter.lineId)
    if (lineId === undefined || chapter.endMs <= chapter.startMs) return
    chapters.push({ title: chapter.title, startMs, lineId })
  })
  return chapters
}

const CLASSIC_RULES = 'Place a digit from 1 to 9 in every empty cell so that each row, each column and each of the nine 3×3 boxes holds every digit exactly once.'
const THERMOMETER_RULE =
  'Along each thermometer the digits climb from the bulb, its round end, to the tip: each one is larger than the one before, though they needn’t be consecutive.'

/** The puzzle's rules in one paragraph, in plain words. */
function rulesOf(outline: Pick<Outline, 'puzzle'>): string {
  return outline.puzzle.thermometers.length > 0 ? `${CLASSIC_RULES} ${THERMOMETER_RULE}` : CLASSIC_RULES
}
