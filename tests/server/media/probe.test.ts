/**
 * probeMedia on real files made by ffmpeg: the length each was generated with is the truth. Compressed
 * formats can only end on a whole frame, so each gets the slack of its frame size.
 */
import { writeFile } from 'node:fs/promises'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { probeMedia } from '../../../server/media/probe'
import { MediaToolError } from '../../../server/media/run-tool'
import { ffmpegFile, mediaFolder, streamedWebm, type MediaFolder } from './make-media'

const SECONDS = 2.5
// an Opus packet is 20 ms as ffmpeg's libopus writes it (RFC 6716 §2.1.4 allows 2.5–60 ms), and the stream
// starts with the encoder's 6.5 ms pre-skip (RFC 7845 §4.2; 312 samples at 48 kHz, from memory)
const OPUS_SLACK_MS = 30
// an AAC frame is 1024 samples, 23 ms at 44.1 kHz (ISO/IEC 14496-3, from memory)
const AAC_SLACK_MS = 25
// an MPEG-1 Layer III frame is 1152 samples (26 ms at 44.1 kHz, ISO/IEC 11172-3); the encoder adds about
// a frame of delay and pads the last one, and MP3 has no field for the exact length (from memory)
const MP3_SLACK_MS = 55

let folder: MediaFolder
beforeAll(async () => {
  folder = await mediaFolder()
})
afterAll(() => folder.remove())

describe('probeMedia', () => {
  it('should read a WAV file’s exact duration and stream facts', async () => {
    const facts = await probeMedia(await ffmpegFile(folder.path('tone.wav'), SECONDS, 'wav'))
    expect(facts).toEqual({
      kind: 'audio',
      durationMs: 2500,
      needsRemux: false,
      facts: { container: 'WAVE', audioCodec: 'pcm_s16le', sampleRate: 44100, channels: 1, bitrate: 705600 },
    })
  })

  it.each([
    ['tone.webm', 'webm', OPUS_SLACK_MS, 'opus'],
    ['tone.m4a', 'mp4', AAC_SLACK_MS, 'aac'],
    ['tone.mp3', 'mp3', MP3_SLACK_MS, 'mp3'],
  ] as const)('should read %s as web-playable audio of the length it was made with', async (name, format, slackMs, codec) => {
    const facts = await probeMedia(await ffmpegFile(folder.path(name), SECONDS, format))
    expect(facts.kind).toBe('audio')
    expect(facts.needsRemux).toBe(false)
    expect(facts.facts).toMatchObject({ audioCodec: codec, sampleRate: format === 'webm' ? 48000 : 44100 })
    expect(Math.abs((facts.durationMs ?? 0) - 2500)).toBeLessThanOrEqual(slackMs)
  })

  it('should read an MP4 video’s picture size and codecs', async () => {
    const facts = await probeMedia(await ffmpegFile(folder.path('picture.mp4'), SECONDS, 'video-mp4'))
    expect(facts).toMatchObject({ kind: 'video', needsRemux: false, facts: { videoCodec: 'h264', width: 160, height: 120, audioCodec: 'aac' } })
    expect(Math.abs((facts.durationMs ?? 0) - 2500)).toBeLessThanOrEqual(AAC_SLACK_MS)
  })

  it('should work out the duration of a WebM written as a stream, and ask for a remux', async () => {
    const facts = await probeMedia(await streamedWebm(folder.path('streamed.webm'), SECONDS))
    expect(facts).toMatchObject({ kind: 'audio', needsRemux: true, facts: { container: 'EBML/webm', audioCodec: 'opus', durationFrom: 'packets' } })
    expect(Math.abs((facts.durationMs ?? 0) - 2500)).toBeLessThanOrEqual(OPUS_SLACK_MS)
  })

  it('should do the same for a streamed WebM video', async () => {
    const facts = await probeMedia(await streamedWebm(folder.path('streamed-video.webm'), SECONDS, true))
    expect(facts).toMatchObject({ kind: 'video', needsRemux: true, facts: { videoCodec: 'vp8', width: 160, height: 120 } })
    expect(Math.abs((facts.durationMs ?? 0) - 2500)).toBeLessThanOrEqual(2 * OPUS_SLACK_MS)
  })

  it('should ask for a remux of audio no browser plays (AC-3 in Matroska)', async () => {
    const facts = await probeMedia(await ffmpegFile(folder.path('tone.mkv'), SECONDS, 'mkv-ac3'))
    expect(facts).toMatchObject({ kind: 'audio', needsRemux: true, facts: { audioCodec: 'ac3' } })
  })

  it('should refuse a file that is not media, in words a person understands', async () => {
    const notMedia = folder.path('notes.mp3')
    await writeFile(notMedia, 'These are my notes for the video, not a recording.\n')
    const probing = probeMedia(notMedia)
    await expect(probing).rejects.toBeInstanceOf(MediaToolError)
    await expect(probing).rejects.toThrow(/could not be read as audio or video/)
  })
})
