/**
 * npx tsx scripts/test-recordings/make.ts <puzzle id>[+<puzzle id>…] <out folder>
 *   [--variant plain|paraphrased] [--seed 1] [--wpm 165] [--captions vtt|srt] [--rolling]
 * Writes a test recording of a take made from fixture puzzles: recording.wav (16 kHz mono), truth.json (the take's
 * lines, where each was really said and which were left out) and captions.vtt or .srt. Same arguments, same files.
 */
import { copyFileSync, mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { captionFile, type CaptionFormat } from './captions'
import { perform, type Variant } from './performance'
import { speak } from './speak'
import { takeLines } from './take'

const USAGE = 'usage: npx tsx scripts/test-recordings/make.ts <puzzle id>[+<id>…] <out folder> [--variant plain|paraphrased] [--seed N] [--wpm N] [--captions vtt|srt] [--rolling]'

function main(argv: string[]): number {
  const [puzzles, out, ...options] = argv
  if (!puzzles || !out) {
    process.stderr.write(`${USAGE}\n`)
    return 2
  }
  const option = (name: string, fallback: string) => {
    const at = options.indexOf(name)
    return at >= 0 && options[at + 1] ? options[at + 1] : fallback
  }
  const variant = option('--variant', 'plain') as Variant
  const format = option('--captions', 'vtt') as CaptionFormat
  const seed = Number(option('--seed', '1'))
  const wordsPerMinute = Number(option('--wpm', '165'))
  if (!['plain', 'paraphrased'].includes(variant) || !['vtt', 'srt'].includes(format) || !Number.isInteger(seed) || !(wordsPerMinute >= 80 && wordsPerMinute <= 450)) {
    process.stderr.write(`${USAGE}\n`)
    return 2
  }
  const lines = takeLines(puzzles.split('+'))
  const performance = perform(lines, variant, seed)
  const recording = speak(performance, wordsPerMinute)
  mkdirSync(out, { recursive: true })
  copyFileSync(recording.wavPath, join(out, 'recording.wav'))
  const said = new Map(recording.spoken.flatMap((u) => (u.lineId === null ? [] : [[u.lineId, u.startMs] as const])))
  const truth = {
    durationMs: recording.durationMs,
    lines: lines.map((l) => ({ ...l, startMs: said.get(l.lineId) ?? null })),
    absent: performance.absent,
    utterances: recording.spoken,
  }
  writeFileSync(join(out, 'truth.json'), `${JSON.stringify(truth, null, 1)}\n`)
  writeFileSync(join(out, `captions.${format}`), captionFile(recording, { format, rolling: options.includes('--rolling'), seed }))
  process.stdout.write(`${join(out, 'recording.wav')}: ${(recording.durationMs / 60_000).toFixed(1)} min, ${lines.length} lines, ${performance.absent.length} left out\n`)
  return 0
}

process.exitCode = main(process.argv.slice(2))
