/**
 * An episode page's data as the public API answers it, built from a real take (a fixture puzzle run through
 * the engine and the script writer) with the shared timeline's times: what the server publishes.
 */
import { timeline } from '@shared/script'
import type { EpisodePage } from '@shared/schemas/episode'
import { outlineFor } from '../../helpers/studio-outline'

export function episodePageFor(id = 'GT07', overrides: Partial<EpisodePage> = {}): EpisodePage {
  const outline = outlineFor(id)
  const times = timeline(outline)
  const startOf = new Map(times.lines.map((l) => [l.id, l.startMs]))
  const lines = outline.lines
    .filter((l) => !l.hidden)
    .map((l) => ({ id: l.id, kind: l.kind, text: l.text, steps: l.steps, startMs: startOf.get(l.id)! }))
  return {
    channel: { name: 'Quince Street Puzzles', slug: 'quince-street' },
    episode: { slug: 'thermo-night-7', title: 'Thermo night, part 7', description: 'A calm thermometer solve.', visibility: 'public', publishAt: '2026-01-05T18:00:00.000Z' },
    puzzle: {
      title: outline.title,
      setter: 'Wren Alder',
      link: 'https://puzzles.example/thermo-7',
      rules: 'Place the digits 1 to 9 once each in every row, column and box. Along each thermometer the digits rise from the bulb.',
      givens: outline.puzzle.givens,
      thermometers: outline.puzzle.thermometers,
    },
    steps: outline.steps,
    lines,
    chapters: times.chapters.map((c) => ({ title: c.title, startMs: c.startMs, lineId: c.lineId })),
    timing: 'estimated',
    durationMs: times.totalMs,
    player: { kind: 'media', url: '/api/episodes/quince-street/thermo-night-7/media', mime: 'video/webm', audioOnly: false },
    captionsUrl: '/api/episodes/quince-street/thermo-night-7/captions.vtt',
    pictureUrl: '/api/episodes/quince-street/thermo-night-7/picture.png',
    ...overrides,
  }
}
