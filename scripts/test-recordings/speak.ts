/**
 * Speaks a performance with espeak-ng, one utterance at a time, and joins the pieces with sox between silences
 * of the planned lengths, so the true start of every utterance is known to the sample. The recording (16 kHz mono
 * 16-bit WAV, what the recogniser reads) is kept in a folder outside the project and reused while its plan is unchanged.
 */
import { execFileSync } from 'node:child_process'
import { createHash } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import type { Performance } from './performance'

interface SpokenUtterance {
  lineId: number | null
  text: string
  /** first and last audible sample, in ms from the recording's start */
  startMs: number
  endMs: number
}

export interface Recording {
  wavPath: string
  durationMs: number
  spoken: SpokenUtterance[]
}

const ESPEAK_RATE = 22050
/** A sample louder than this (of 32768) is speech; espeak-ng's own lead-in and tail are digital silence. */
const AUDIBLE = 64

/** The recording of a performance at `wordsPerMinute`, made once and then read from the cache. */
export function speak(performance: Performance, wordsPerMinute: number, cacheRoot = join(tmpdir(), 'gridcue-test-recordings')): Recording {
  const plan = JSON.stringify({ wordsPerMinute, utterances: performance.utterances, version: 1 })
  const folder = join(cacheRoot, createHash('sha256').update(plan).digest('hex').slice(0, 16))
  const manifest = join(folder, 'recording.json')
  if (existsSync(manifest)) return JSON.parse(readFileSync(manifest, 'utf8')) as Recording
  mkdirSync(folder, { recursive: true })

  const pieces: string[] = []
  const spoken: SpokenUtterance[] = []
  let samples = 0
  performance.utterances.forEach((u, i) => {
    const pauseSamples = Math.round((u.pauseMs / 1000) * ESPEAK_RATE)
    const silence = join(folder, `pause-${i}.wav`)
    writeFileSync(silence, silentWav(pauseSamples))
    const voice = join(folder, `line-${i}.wav`)
    execFileSync('espeak-ng', ['-v', 'en-us', '-s', String(wordsPerMinute), '-w', voice, u.text])
    const pcm = pcmOf(readFileSync(voice))
    const { first, last } = audibleSpan(pcm)
    samples += pauseSamples
    spoken.push({ lineId: u.lineId, text: u.text, startMs: toMs(samples + first), endMs: toMs(samples + last) })
    samples += pcm.length
    pieces.push(silence, voice)
  })
  const wavPath = join(folder, 'recording.wav')
  // sox reads its inputs from a list this long without trouble; `rate` resamples for the recogniser.
  execFileSync('sox', [...pieces, '-r', '16000', '-c', '1', '-b', '16', wavPath, 'rate', '16000'])
  execFileSync('sh', ['-c', 'rm -f "$1"/pause-*.wav "$1"/line-*.wav', 'sh', folder])
  const recording: Recording = { wavPath, durationMs: toMs(samples), spoken }
  writeFileSync(manifest, JSON.stringify(recording))
  return recording
}

/** A mono 16-bit WAV of `count` zero samples at espeak-ng's rate (44-byte RIFF header, then the samples). */
function silentWav(count: number): Buffer {
  const wav = Buffer.alloc(44 + count * 2)
  wav.write('RIFF', 0, 'ascii')
  wav.writeUInt32LE(36 + count * 2, 4)
  wav.write('WAVEfmt ', 8, 'ascii')
  wav.writeUInt32LE(16, 16)
  wav.writeUInt16LE(1, 20)
  wav.writeUInt16LE(1, 22)
  wav.writeUInt32LE(ESPEAK_RATE, 24)
  wav.writeUInt32LE(ESPEAK_RATE * 2, 28)
  wav.writeUInt16LE(2, 32)
  wav.writeUInt16LE(16, 34)
  wav.write('data', 36, 'ascii')
  wav.writeUInt32LE(count * 2, 40)
  return wav
}

function toMs(sampleCount: number): number {
  return Math.round((sampleCount / ESPEAK_RATE) * 1000)
}

/** The 16-bit samples of a canonical WAV file (RIFF chunks walked until "data"). */
function pcmOf(wav: Buffer): Int16Array {
  let at = 12
  while (at + 8 <= wav.length) {
    const id = wav.toString('ascii', at, at + 4)
    const size = wav.readUInt32LE(at + 4)
    if (id === 'data') {
      const bytes = Math.min(size, wav.length - at - 8) & ~1
      return new Int16Array(wav.buffer.slice(wav.byteOffset + at + 8, wav.byteOffset + at + 8 + bytes))
    }
    at += 8 + size + (size % 2)
  }
  throw new Error('no data chunk in the WAV espeak-ng wrote')
}

function audibleSpan(pcm: Int16Array): { first: number; last: number } {
  let first = 0
  while (first < pcm.length && Math.abs(pcm[first]) <= AUDIBLE) first++
  let last = pcm.length - 1
  while (last > first && Math.abs(pcm[last]) <= AUDIBLE) last--
  return { first: Math.min(first, pcm.length), last }
}
