/**
 * One small round trip through the whole caption path: a few script lines spoken by espeak-ng and joined by sox
 * (scripts/test-recordings), captioned as automatic captions are, read back by captionWords and matched by
 * alignLines. The truth is the first audible sample of each line in the WAV that was made.
 */
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, expect, test } from 'vitest'
import { captionWords } from '../../../server/captions/caption-words'
import { alignLines } from '../../../shared/align/index'
import { captionFile } from '../../../scripts/test-recordings/captions'
import { speak } from '../../../scripts/test-recordings/speak'

const folder = mkdtempSync(join(tmpdir(), 'gridcue-round-trip-'))
afterAll(() => rmSync(folder, { recursive: true, force: true }))

const LINES = [
  { lineId: 1, text: 'Hello and welcome to a thermometer puzzle by Tamsin Orr.' },
  { lineId: 2, text: "There's just one home for a 3 in this box: r3c5." },
  { lineId: 3, text: 'The bottom-middle box still needs a 6, and only one cell can take it.' },
]

test('spoken lines with a left-out line and chatter, captioned and read back => each said line within 1 s, the left-out one unplaced', () => {
  const recording = speak(
    {
      utterances: [
        { lineId: 1, text: LINES[0].text, pauseMs: 500 },
        { lineId: null, text: 'Let me just have a quick sip of tea.', pauseMs: 1500 },
        { lineId: 3, text: LINES[2].text, pauseMs: 2000 },
      ],
      absent: [2],
    },
    170,
    folder,
  )
  const file = captionFile(recording, { format: 'vtt', rolling: true, seed: 5 })
  const result = alignLines(LINES, captionWords(file))
  expect(result.unplaced).toEqual([2])
  const said = new Map(recording.spoken.map((u) => [u.lineId, u.startMs]))
  expect(result.proposals.map((p) => p.lineId)).toEqual([1, 3])
  for (const p of result.proposals) expect(Math.abs(p.startMs - said.get(p.lineId)!)).toBeLessThanOrEqual(1000)
})
