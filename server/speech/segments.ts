import { open } from 'node:fs/promises'

/** One stretch of speech to recognise on its own, in 10 ms frames of the recognition WAV. */
export interface Segment {
  startFrame: number
  endFrame: number
}

export interface SpeechAudio {
  /** where the samples start: the WAV header's length */
  dataOffset: number
  durationMs: number
  segments: Segment[]
}

const SAMPLES_PER_FRAME = 160 // 10 ms at 16 kHz, the recogniser's frame
// a pause this long ends an utterance; shorter ones are breaths inside a sentence
const MIN_PAUSE_FRAMES = 30
// speech starts and ends softer than its middle, and the recogniser wants a little silence around it:
// a margin either side, up to the middle of the pause (tried: 150 ms lost 1 point of word accuracy)
const MARGIN_FRAMES = 30
// longer utterances cost the search more and gain nothing: cut them at their quietest moment
const MAX_SEGMENT_FRAMES = 3000
// speech stands this far above the recording's quiet floor: its 2nd percentile frame, as a recording
// may be nearly all talk
const SPEECH_ABOVE_FLOOR_DB = 12
const FLOOR_PERCENTILE = 0.02
const READ_BYTES = 1 << 20

/**
 * Finds the stretches of speech in a 16 kHz mono 16-bit WAV by frame energy, reading it in pieces.
 * Each is then recognised as one utterance with its own known start, so word times are exact
 * (pocketsphinx's own voice detection misplaced whole utterances by seconds here).
 */
export async function findSpeech(wavPath: string): Promise<SpeechAudio> {
  const file = await open(wavPath, 'r')
  try {
    const dataOffset = await wavDataOffset(file, wavPath)
    const energies = await frameEnergies(file, dataOffset)
    return { dataOffset, durationMs: energies.length * 10, segments: segmentsOf(energies) }
  } finally {
    await file.close()
  }
}

type FileHandle = Awaited<ReturnType<typeof open>>

// RIFF: "RIFF" size "WAVE", then chunks (id, size, body); ffmpeg puts a LIST chunk before "data"
async function wavDataOffset(file: FileHandle, wavPath: string): Promise<number> {
  const { buffer, bytesRead } = await file.read(Buffer.alloc(4096), 0, 4096, 0)
  let at = 12
  while (at + 8 <= bytesRead) {
    const id = buffer.toString('latin1', at, at + 4)
    if (id === 'data') return at + 8
    at += 8 + buffer.readUInt32LE(at + 4) + (buffer.readUInt32LE(at + 4) % 2)
  }
  throw new Error(`${wavPath} is not a WAV file with its samples near the start`)
}

async function frameEnergies(file: FileHandle, dataOffset: number): Promise<Float32Array> {
  const { size } = await file.stat()
  const frames = Math.floor((size - dataOffset) / 2 / SAMPLES_PER_FRAME)
  const energies = new Float32Array(frames)
  const buffer = Buffer.alloc(READ_BYTES)
  const frameBytes = SAMPLES_PER_FRAME * 2
  for (let frame = 0; frame < frames; ) {
    const wanted = Math.min(READ_BYTES - (READ_BYTES % frameBytes), (frames - frame) * frameBytes)
    const { bytesRead } = await file.read(buffer, 0, wanted, dataOffset + frame * frameBytes)
    if (bytesRead < frameBytes) break
    for (let at = 0; at + frameBytes <= bytesRead; at += frameBytes, frame++) {
      let sum = 0
      for (let i = 0; i < SAMPLES_PER_FRAME; i++) {
        const sample = buffer.readInt16LE(at + i * 2)
        sum += sample * sample
      }
      energies[frame] = 10 * Math.log10(sum / SAMPLES_PER_FRAME + 1)
    }
  }
  return energies
}

function segmentsOf(energies: Float32Array): Segment[] {
  if (energies.length === 0) return []
  const sorted = Float32Array.from(energies).sort()
  const threshold = sorted[Math.floor(sorted.length * FLOOR_PERCENTILE)] + SPEECH_ABOVE_FLOOR_DB
  const segments: Segment[] = []
  let start = -1
  let lastSpeech = -1
  for (let frame = 0; frame < energies.length; frame++) {
    if (energies[frame] < threshold) continue
    if (start >= 0 && frame - lastSpeech > MIN_PAUSE_FRAMES) {
      segments.push({ startFrame: start, endFrame: lastSpeech })
      start = -1
    }
    if (start < 0) start = frame
    lastSpeech = frame
  }
  if (start >= 0) segments.push({ startFrame: start, endFrame: lastSpeech })
  const last = energies.length - 1
  return segments
    .map(({ startFrame, endFrame }, i) => ({
      startFrame: Math.max(0, startFrame - MARGIN_FRAMES, i > 0 ? Math.floor((segments[i - 1].endFrame + startFrame) / 2) + 1 : 0),
      endFrame: Math.min(last, endFrame + MARGIN_FRAMES, i + 1 < segments.length ? Math.floor((endFrame + segments[i + 1].startFrame) / 2) : last),
    }))
    .flatMap((segment) => splitLong(segment, energies))
}

function splitLong(segment: Segment, energies: Float32Array): Segment[] {
  const length = segment.endFrame - segment.startFrame
  if (length <= MAX_SEGMENT_FRAMES) return [segment]
  // the quietest frame in the middle half, so neither part is tiny
  let cut = segment.startFrame + Math.floor(length / 4)
  for (let frame = cut; frame < segment.endFrame - length / 4; frame++) if (energies[frame] < energies[cut]) cut = frame
  return [...splitLong({ startFrame: segment.startFrame, endFrame: cut }, energies), ...splitLong({ startFrame: cut + 1, endFrame: segment.endFrame }, energies)]
}
