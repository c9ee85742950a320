/**
 * planWebCopy + writeWebCopy on real files: the result is read back by the same probe and by ffprobe's own view of it,
 * so "web-playable" means codecs and containers every browser engine plays (common practice).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { probeMedia } from '../../../server/media/probe'
import { planWebCopy, writeWebCopy } from '../../../server/media/remux'
import { ffmpegFile, mediaFolder, streamedWebm, type MediaFolder } from './make-media'

// an Opus packet is 20 ms as ffmpeg's libopus writes it (RFC 6716 §2.1.4 allows 2.5–60 ms), and the stream
// starts with the encoder's 6.5 ms pre-skip (RFC 7845 §4.2; 312 samples at 48 kHz, from memory)
const OPUS_SLACK_MS = 30
const AAC_SLACK_MS = 25

let folder: MediaFolder
beforeAll(async () => {
  folder = await mediaFolder()
})
afterAll(() => folder.remove())

/** Plans and writes the copy; answers what the plan says of it, as the recordings service reads it. */
async function remuxForWeb(inPath: string, outPath: string) {
  const plan = await planWebCopy(inPath)
  await writeWebCopy(inPath, outPath, plan)
  return { mime: plan.mime, transcoded: plan.transcoded }
}

describe('the browser-playable copy', () => {
  it('should copy a streamed WebM’s audio into a WebM that states its duration', async () => {
    const source = await streamedWebm(folder.path('streamed.webm'), 2.5)
    const result = await remuxForWeb(source, folder.path('fixed.webm'))
    expect(result).toEqual({ mime: 'audio/webm', transcoded: false })
    const facts = await probeMedia(folder.path('fixed.webm'))
    expect(facts).toMatchObject({ kind: 'audio', needsRemux: false, facts: { container: 'EBML/webm', audioCodec: 'opus' } })
    expect(facts.facts).not.toHaveProperty('durationFrom')
    expect(Math.abs((facts.durationMs ?? 0) - 2500)).toBeLessThanOrEqual(OPUS_SLACK_MS)
  })

  it('should copy a streamed WebM video without re-encoding it', async () => {
    const source = await streamedWebm(folder.path('streamed-video.webm'), 2, true)
    const result = await remuxForWeb(source, folder.path('fixed-video.webm'))
    expect(result).toEqual({ mime: 'video/webm', transcoded: false })
    expect(await probeMedia(folder.path('fixed-video.webm'))).toMatchObject({ kind: 'video', needsRemux: false, facts: { videoCodec: 'vp8', audioCodec: 'opus' } })
  })

  it('should transcode audio no browser plays to AAC in MP4, whatever the output’s name says', async () => {
    const source = await ffmpegFile(folder.path('tone.mkv'), 2.5, 'mkv-ac3')
    const result = await remuxForWeb(source, folder.path('fixed.webm'))
    expect(result).toEqual({ mime: 'audio/mp4', transcoded: true })
    const facts = await probeMedia(folder.path('fixed.webm'))
    expect(facts).toMatchObject({ kind: 'audio', needsRemux: false, facts: { audioCodec: 'aac' } })
    expect(Math.abs((facts.durationMs ?? 0) - 2500)).toBeLessThanOrEqual(2 * AAC_SLACK_MS)
  })

  it('should keep H.264 and AAC as they are in an MP4 with its index at the front', async () => {
    const source = await ffmpegFile(folder.path('picture.mp4'), 2, 'video-mp4')
    expect(await remuxForWeb(source, folder.path('fixed.mp4'))).toEqual({ mime: 'video/mp4', transcoded: false })
    expect(await probeMedia(folder.path('fixed.mp4'))).toMatchObject({ kind: 'video', needsRemux: false, facts: { videoCodec: 'h264', audioCodec: 'aac' } })
  })
})
