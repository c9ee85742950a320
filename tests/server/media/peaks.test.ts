/**
 * computePeaks on signals whose loudness is known sample by sample: a WAV written here, silence then a
 * full-scale tone, so the peaks must read ~0 then ~1 in the slices where each lies.
 */
import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { computePeaks } from '../../../server/media/peaks'
import { ffmpegFile, mediaFolder, wavFile, type MediaFolder } from './make-media'

let folder: MediaFolder
beforeAll(async () => {
  folder = await mediaFolder()
})
afterAll(() => folder.remove())

/** `silentSeconds` of silence, then `loudSeconds` of a 440 Hz sine at full scale. */
function silenceThenTone(sampleRate: number, silentSeconds: number, loudSeconds: number): Float64Array {
  const samples = new Float64Array(Math.round((silentSeconds + loudSeconds) * sampleRate))
  for (let i = Math.round(silentSeconds * sampleRate); i < samples.length; i++) samples[i] = Math.sin((2 * Math.PI * 440 * i) / sampleRate)
  return samples
}

describe('computePeaks', () => {
  it('should read silence as 0 and a full-scale tone as 1, each in its own slices', async () => {
    const file = await wavFile(folder.path('silence-then-tone.wav'), 44100, silenceThenTone(44100, 1, 1))
    const { durationMs, perSecond, peaks } = await computePeaks(file, { perSecond: 10 })
    expect(durationMs).toBe(2000)
    expect(perSecond).toBe(10)
    expect(peaks).toHaveLength(20)
    // the resampler's filter rings a little ahead of the tone's start, so the last silent slice may stir
    expect(Math.max(...peaks.slice(0, 9))).toBe(0)
    expect(peaks[9]).toBeLessThan(0.1)
    for (const peak of peaks.slice(10)) expect(peak).toBeGreaterThanOrEqual(0.97)
    expect(Math.max(...peaks)).toBeLessThanOrEqual(1)
  })

  it('should read a tone at a quarter of full scale as 0.25, rounded to 3 decimals', async () => {
    const file = await wavFile(folder.path('quarter.wav'), 16000, silenceThenTone(16000, 0, 1.5).map((sample) => sample / 4))
    const { peaks } = await computePeaks(file, { perSecond: 4 })
    expect(peaks).toHaveLength(6)
    for (const peak of peaks) {
      expect(peak).toBeCloseTo(0.25, 2)
      expect(Number(peak.toFixed(3))).toBe(peak)
    }
  })

  it('should cut slices that are not a whole number of samples without losing any (30 a second)', async () => {
    const file = await ffmpegFile(folder.path('tone.mp3'), 3, 'mp3')
    const { durationMs, peaks } = await computePeaks(file, { perSecond: 30 })
    expect(peaks).toHaveLength(Math.ceil((durationMs * 30) / 1000))
    // ffmpeg's lavfi sine source plays at 1/8 of full scale unless told otherwise (ffmpeg-filters, "sine")
    expect(Math.max(...peaks)).toBeCloseTo(0.125, 1)
  })

  it('should stop ffmpeg when aborted, even while it waits for input that never comes', async () => {
    const fifo = folder.path('never-written.fifo')
    await promisify(execFile)('mkfifo', [fifo])
    const controller = new AbortController()
    const computing = computePeaks(fifo, { perSecond: 10, signal: controller.signal })
    setTimeout(() => controller.abort(new Error('the editor cancelled')), 200)
    await expect(computing).rejects.toThrow('the editor cancelled')
  })

  it('should refuse a slice count that is not a whole number', async () => {
    await expect(computePeaks(folder.path('any.wav'), { perSecond: 2.5 })).rejects.toThrow(RangeError)
  })
})
