/** toRecognitionWav: what pocketsphinx's English model reads, 16 kHz mono 16-bit PCM (its README, from memory). */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { probeMedia } from '../../../server/media/probe'
import { toRecognitionWav } from '../../../server/media/recognition-wav'
import { ffmpegFile, mediaFolder, type MediaFolder } from './make-media'

let folder: MediaFolder
beforeAll(async () => {
  folder = await mediaFolder()
})
afterAll(() => folder.remove())

describe('toRecognitionWav', () => {
  it('should turn a video’s sound into 16 kHz mono 16-bit WAV of the same length', async () => {
    const source = await ffmpegFile(folder.path('picture.mp4'), 2, 'video-mp4')
    await toRecognitionWav(source, folder.path('speech.wav'))
    const facts = await probeMedia(folder.path('speech.wav'))
    expect(facts.facts).toMatchObject({ container: 'WAVE', audioCodec: 'pcm_s16le', sampleRate: 16000, channels: 1 })
    // the AAC frame the source ends on (1024 samples, 23 ms at 44.1 kHz) is the only slack
    expect(Math.abs((facts.durationMs ?? 0) - 2000)).toBeLessThanOrEqual(25)
  })
})
