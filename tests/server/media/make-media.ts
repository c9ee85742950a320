/**
 * Real media files made for a test, each with a length known from how it was made: ffmpeg's lavfi
 * generators and espeak-ng are the outside truth the probes and the recogniser are checked against.
 */
import { execFile } from 'node:child_process'
import { mkdtemp, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { promisify } from 'node:util'

const run = promisify(execFile)

export interface MediaFolder {
  path: (name: string) => string
  remove: () => Promise<void>
}

export async function mediaFolder(): Promise<MediaFolder> {
  const folder = await mkdtemp(join(tmpdir(), 'gridcue-media-test-'))
  return { path: (name) => join(folder, name), remove: () => rm(folder, { recursive: true, force: true }) }
}

const tone = (seconds: number) => ['-f', 'lavfi', '-i', `sine=frequency=440:sample_rate=44100:duration=${seconds}`]
const picture = (seconds: number) => ['-f', 'lavfi', '-i', `testsrc=size=160x120:rate=25:duration=${seconds}`]
// the fastest settings: the pictures only need to exist
const VP8 = ['-c:v', 'libvpx', '-deadline', 'realtime', '-cpu-used', '8']
const H264 = ['-c:v', 'libx264', '-preset', 'ultrafast', '-pix_fmt', 'yuv420p']

/** A file of `seconds` of tone (and moving picture for video), in the format its arguments give. */
export async function ffmpegFile(out: string, seconds: number, format: 'wav' | 'webm' | 'mp3' | 'mp4' | 'mkv-ac3' | 'video-mp4' | 'video-webm'): Promise<string> {
  const args: Record<typeof format, string[]> = {
    wav: [...tone(seconds), '-c:a', 'pcm_s16le'],
    webm: [...tone(seconds), '-c:a', 'libopus'],
    mp3: [...tone(seconds), '-c:a', 'libmp3lame'],
    mp4: [...tone(seconds), '-c:a', 'aac'],
    'mkv-ac3': [...tone(seconds), '-c:a', 'ac3'],
    'video-mp4': [...picture(seconds), ...tone(seconds), ...H264, '-c:a', 'aac'],
    'video-webm': [...picture(seconds), ...tone(seconds), ...VP8, '-c:a', 'libopus'],
  }
  await run('ffmpeg', ['-nostdin', '-v', 'error', '-y', ...args[format], out])
  return out
}

/**
 * WebM written to a pipe, as a browser's recorder writes it: the muxer can't go back to fill in the
 * duration or the seek index, so the file has neither.
 */
export async function streamedWebm(out: string, seconds: number, withVideo = false): Promise<string> {
  const inputs = withVideo ? [...picture(seconds), ...tone(seconds), ...VP8] : tone(seconds)
  const { stdout } = await run('ffmpeg', ['-nostdin', '-v', 'error', ...inputs, '-c:a', 'libopus', '-f', 'webm', 'pipe:1'], {
    encoding: 'buffer',
    maxBuffer: 64 * 1024 * 1024,
  })
  await writeFile(out, stdout)
  return out
}

/** A 16-bit mono WAV written byte by byte (RIFF header, then little-endian PCM), from samples in -1..1. */
export async function wavFile(out: string, sampleRate: number, samples: Float64Array): Promise<string> {
  const header = Buffer.alloc(44)
  const dataBytes = samples.length * 2
  header.write('RIFF', 0)
  header.writeUInt32LE(36 + dataBytes, 4)
  header.write('WAVEfmt ', 8)
  header.writeUInt32LE(16, 16) // fmt chunk size
  header.writeUInt16LE(1, 20) // PCM
  header.writeUInt16LE(1, 22) // one channel
  header.writeUInt32LE(sampleRate, 24)
  header.writeUInt32LE(sampleRate * 2, 28) // bytes a second
  header.writeUInt16LE(2, 32) // bytes a frame
  header.writeUInt16LE(16, 34) // bits a sample
  header.write('data', 36)
  header.writeUInt32LE(dataBytes, 40)
  const pcm = Buffer.alloc(dataBytes)
  samples.forEach((sample, i) => pcm.writeInt16LE(Math.max(-32768, Math.min(32767, Math.round(sample * 32767))), i * 2))
  await writeFile(out, Buffer.concat([header, pcm]))
  return out
}

/** Synthetic speech of `text` (espeak-ng, US English, 165 words a minute) as WAV, with `pad` seconds of silence either side (sox). */
export async function spokenWav(out: string, text: string, pad: number): Promise<string> {
  const bare = `${out}.bare.wav`
  await run('espeak-ng', ['-v', 'en-us', '-s', '165', '-w', bare, text])
  await run('sox', [bare, out, 'pad', String(pad), String(pad)])
  await rm(bare)
  return out
}
