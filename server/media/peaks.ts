import { endianness } from 'node:os'
import type { Peaks } from '../../shared/schemas/recording'
import { FFMPEG_INSTALL_HINT } from './ffprobe'
import { runTool } from './run-tool'

// Low enough that an hour is a small stream (8,000 samples a second), high enough to keep speech's
// loudness: ffmpeg's resampler filters out only what lies above 4 kHz.
const PEAK_SAMPLE_RATE = 8000
const FULL_SCALE = 32768
// samples in this machine's byte order, so they are read through an Int16Array without conversion
const PCM_FORMAT = endianness() === 'LE' ? 's16le' : 's16be'

/**
 * The waveform of a recording's audio: the largest absolute sample in each 1/perSecond slice, 0..1,
 * rounded to 3 decimals. ffmpeg decodes to mono 16-bit PCM on a pipe and the slices are taken as the
 * samples stream past, so memory stays flat however long the recording is.
 */
export async function computePeaks(path: string, options: { perSecond: number; signal?: AbortSignal }): Promise<Peaks> {
  const { perSecond, signal } = options
  if (!Number.isInteger(perSecond) || perSecond < 1 || perSecond > PEAK_SAMPLE_RATE) {
    throw new RangeError(`perSecond must be a whole number from 1 to ${PEAK_SAMPLE_RATE}, not ${perSecond}`)
  }
  const slicer = new PeakSlicer(perSecond)
  await runTool(
    'ffmpeg',
    ['-nostdin', '-v', 'error', '-i', path, '-map', '0:a:0', '-ac', '1', '-ar', String(PEAK_SAMPLE_RATE), '-f', PCM_FORMAT, 'pipe:1'],
    { signal, installHint: FFMPEG_INSTALL_HINT, background: true, onStdout: (chunk) => slicer.take(chunk) },
  )
  return slicer.finish()
}

class PeakSlicer {
  private readonly peaks: number[] = []
  private samples = 0
  private slicePeak = 0
  private samplesInSlice = 0
  private sliceEnd: number
  // a chunk may end in the middle of a 2-byte sample
  private oddByte: number | null = null

  constructor(private readonly perSecond: number) {
    this.sliceEnd = this.sampleAtSliceEnd(0)
  }

  take(chunk: Buffer): void {
    const bytes = this.oddByte === null ? chunk : Buffer.concat([Buffer.from([this.oddByte]), chunk])
    const usable = bytes.length & ~1
    this.oddByte = usable < bytes.length ? bytes[usable] : null
    // an Int16Array must start on an even address; a chunk that doesn't is copied
    const aligned = bytes.byteOffset % 2 === 0 ? bytes : Buffer.from(bytes)
    for (const sample of new Int16Array(aligned.buffer, aligned.byteOffset, usable / 2)) this.add(sample)
  }

  finish(): Peaks {
    if (this.samplesInSlice > 0) this.closeSlice()
    return { durationMs: Math.round((this.samples * 1000) / PEAK_SAMPLE_RATE), perSecond: this.perSecond, peaks: this.peaks }
  }

  private add(sample: number): void {
    const magnitude = sample < 0 ? -sample : sample
    if (magnitude > this.slicePeak) this.slicePeak = magnitude
    this.samples += 1
    this.samplesInSlice += 1
    if (this.samples === this.sliceEnd) this.closeSlice()
  }

  private closeSlice(): void {
    this.peaks.push(Math.round((Math.min(this.slicePeak, FULL_SCALE) / FULL_SCALE) * 1000) / 1000)
    this.slicePeak = 0
    this.samplesInSlice = 0
    this.sliceEnd = this.sampleAtSliceEnd(this.peaks.length)
  }

  // slices need not hold a whole number of samples (e.g. 30 per second at 8 kHz): each ends at its own rounded boundary
  private sampleAtSliceEnd(slice: number): number {
    return Math.round(((slice + 1) * PEAK_SAMPLE_RATE) / this.perSecond)
  }
}
