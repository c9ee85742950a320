/**
 * findSpeech on a WAV written sample by sample: tone where "speech" is, digital silence between, so
 * where each stretch starts and ends is known exactly (10 ms frames, the recogniser's own).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { findSpeech } from '../../../server/speech/segments'
import { mediaFolder, wavFile, type MediaFolder } from '../media/make-media'

const RATE = 16000

let folder: MediaFolder
beforeAll(async () => {
  folder = await mediaFolder()
})
afterAll(() => folder.remove())

/** Tone at half scale during each [start, end) second range, silence elsewhere. */
function toneAt(seconds: number, ranges: [number, number][]): Float64Array {
  const samples = new Float64Array(seconds * RATE)
  for (const [start, end] of ranges) for (let i = start * RATE; i < end * RATE; i++) samples[i] = 0.5 * Math.sin((2 * Math.PI * 300 * i) / RATE)
  return samples
}

describe('findSpeech', () => {
  it('should find each stretch of sound, with a margin of quiet either side', async () => {
    const file = await wavFile(folder.path('two-stretches.wav'), RATE, toneAt(6, [[1, 2.5], [4, 5]]))
    const { dataOffset, durationMs, segments } = await findSpeech(file)
    expect(dataOffset).toBe(44)
    expect(durationMs).toBe(6000)
    expect(segments).toEqual([
      { startFrame: 70, endFrame: 279 },
      { startFrame: 370, endFrame: 529 },
    ])
  })

  it('should keep a short pause inside one stretch, and split the margin of two close stretches at their middle', async () => {
    const file = await wavFile(folder.path('close.wav'), RATE, toneAt(4, [[1, 1.5], [1.7, 2], [2.4, 3]]))
    const { segments } = await findSpeech(file)
    // 0.2 s is a breath (under 0.3 s); 0.4 s is a pause, whose middle is at 2.2 s
    expect(segments).toEqual([
      { startFrame: 70, endFrame: 219 },
      { startFrame: 220, endFrame: 329 },
    ])
  })

  it('should cut a stretch longer than 30 seconds where it is quietest', async () => {
    const file = await wavFile(folder.path('long.wav'), RATE, toneAt(40, [[0.5, 20], [20.1, 39]]))
    const { segments } = await findSpeech(file)
    expect(segments).toHaveLength(2)
    expect(segments[0].endFrame).toBeGreaterThanOrEqual(2000)
    expect(segments[0].endFrame).toBeLessThan(2010)
  })
})
