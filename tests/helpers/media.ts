import { execFileSync } from 'node:child_process'
import { mkdtempSync, readFileSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

/**
 * A mono 16-bit PCM WAV file of a sine tone at half of full scale, written byte by byte: the 44-byte
 * RIFF header (WAVE format, "fmt " chunk of 16 bytes, PCM = 1) and the samples, little-endian.
 * Source: the RIFF WAVE format as Microsoft documents it (Multimedia Programming Interface and Data
 * Specifications 1.0, 1991); from memory.
 */
export function wavFile({ seconds = 1, sampleRate = 8000, frequency = 440 } = {}): Buffer {
  const samples = Math.round(seconds * sampleRate)
  const wav = Buffer.alloc(44 + samples * 2)
  wav.write('RIFF', 0, 'ascii')
  wav.writeUInt32LE(36 + samples * 2, 4)
  wav.write('WAVEfmt ', 8, 'ascii')
  wav.writeUInt32LE(16, 16)
  wav.writeUInt16LE(1, 20) // PCM
  wav.writeUInt16LE(1, 22) // one channel
  wav.writeUInt32LE(sampleRate, 24)
  wav.writeUInt32LE(sampleRate * 2, 28) // bytes per second
  wav.writeUInt16LE(2, 32) // bytes per sample frame
  wav.writeUInt16LE(16, 34) // bits per sample
  wav.write('data', 36, 'ascii')
  wav.writeUInt32LE(samples * 2, 40)
  for (let i = 0; i < samples; i++) wav.writeInt16LE(Math.round(16384 * Math.sin((2 * Math.PI * frequency * i) / sampleRate)), 44 + i * 2)
  return wav
}

/**
 * A short media file made by ffmpeg from its built-in test sources (lavfi), e.g. `['-c:a', 'libopus']` and 'webm'.
 * `streamed` writes it to a pipe, as a browser's recorder does: ffmpeg can't go back to fill in the duration and index.
 */
export function ffmpegFile(ext: string, args: string[], { seconds = 2, video = false, streamed = false } = {}): Buffer {
  const dir = mkdtempSync(join(tmpdir(), 'gridcue-media-'))
  try {
    const out = join(dir, `made.${ext}`)
    const sources = ['-f', 'lavfi', '-i', `sine=frequency=440:duration=${seconds}`, ...(video ? ['-f', 'lavfi', '-i', `testsrc=size=64x48:rate=10:duration=${seconds}`] : [])]
    const command = ['-nostdin', '-v', 'error', '-y', ...sources, ...args]
    if (streamed) return execFileSync('ffmpeg', [...command, '-f', ext, 'pipe:1'], { maxBuffer: 64 * 1024 * 1024 })
    execFileSync('ffmpeg', [...command, out])
    return readFileSync(out)
  } finally {
    rmSync(dir, { recursive: true, force: true })
  }
}
