/**
 * npm run bench:align [-- --only captions|audio] [--takes N] [--reuse-recognition]
 * Alignment accuracy on generated test recordings (scripts/test-recordings): five takes of 10–15 minutes made
 * from our fixture puzzles, each spoken plainly and paraphrased, aligned from their caption files and from the
 * audio. Prints, per method × variant: lines within 1.0 s and 2.0 s of the truth, wrongly placed (> 5 s off),
 * unplaced, absent lines placed anyway, and CPU seconds per minute of audio — for Gridcue's matcher and, on the same
 * heard words, for the issue's simple baseline (one diff over the words, each line at its first matched word).
 * Figures go to docs/performance.md.
 * --reuse-recognition reads the words recognised by an earlier run (kept beside each recording) instead of running
 * the recogniser again, for tuning the matcher; its CPU figure then counts the matcher alone (marked *).
 */
import { diffArrays } from 'diff'
import { distance } from 'fastest-levenshtein'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { cpus } from 'node:os'
import { dirname, join } from 'node:path'
import { alignLines, spokenWords, type Alignment, type TimedWord } from '../shared/align/index'
import { captionWords } from '../server/captions/caption-words'
import { captionFile, type CaptionStyle } from './test-recordings/captions'
import { perform, type Performance, type Variant } from './test-recordings/performance'
import { speak, type Recording } from './test-recordings/speak'
import { takeLines, type TakeLine } from './test-recordings/take'

interface Take {
  name: string
  puzzles: string[]
  wordsPerMinute: number
  seed: number
  captions: Omit<CaptionStyle, 'seed'>
}

const TAKES: Take[] = [
  { name: 'thermo GT07', puzzles: ['GT07'], wordsPerMinute: 165, seed: 1, captions: { format: 'vtt', rolling: true } },
  { name: 'classic PE06+PE07+PE50', puzzles: ['PE06', 'PE07', 'PE50'], wordsPerMinute: 170, seed: 2, captions: { format: 'srt', rolling: false } },
  { name: 'thermo GT40', puzzles: ['GT40'], wordsPerMinute: 175, seed: 3, captions: { format: 'vtt', rolling: false } },
  { name: 'classic PE42+PE43+PE47', puzzles: ['PE42', 'PE43', 'PE47'], wordsPerMinute: 155, seed: 4, captions: { format: 'vtt', rolling: true } },
  { name: 'thermo GT17', puzzles: ['GT17'], wordsPerMinute: 160, seed: 5, captions: { format: 'srt', rolling: false } },
]
const VARIANTS: Variant[] = ['plain', 'paraphrased']
const SPEED_PUZZLES = [...Array.from({ length: 50 }, (_, i) => `PE${String(i + 1).padStart(2, '0')}`), ...['GT03', 'GT04', 'GT07', 'GT13', 'GT14', 'GT16', 'GT17', 'GT18', 'GT22', 'GT24', 'GT27', 'GT29', 'GT35', 'GT38', 'GT39', 'GT40']]
type Method = 'captions' | 'audio'
type Recognise = (mediaPath: string, scriptTexts: string[]) => Promise<TimedWord[]>

interface Score {
  lines: number
  within1: number
  within2: number
  wrong: number
  unplaced: number
  absent: number
  absentPlaced: number
  audioMs: number
  cpuMs: number
}

async function main() {
  const args = process.argv.slice(2)
  const only = valueOf(args, '--only') as Method | undefined
  const takes = TAKES.slice(0, Number(valueOf(args, '--takes') ?? TAKES.length))
  const reuse = args.includes('--reuse-recognition')
  const recognise = only === 'captions' ? undefined : await loadRecogniser()
  const methods: Method[] = only ? [only] : recognise ? ['captions', 'audio'] : ['captions']
  if (!recognise && only !== 'captions') console.log('server/speech/recognise.ts is not there yet: captions only.\n')

  const totals = new Map<string, Score>()
  console.log(`Gridcue alignment benchmark — ${new Date().toISOString().slice(0, 10)}, ${cpus().length} × ${cpus()[0]?.model.trim()}, Node ${process.version}`)
  console.log('take                     variant      method    lines  ≤1 s    ≤2 s    >5 s  unplaced  absent placed  CPU s/min')
  for (const take of takes) {
    const lines = takeLines(take.puzzles)
    for (const variant of VARIANTS) {
      const performance = perform(lines, variant, take.seed)
      const recording = speak(performance, take.wordsPerMinute)
      for (const method of methods) {
        const cpuBefore = cpuMs()
        const saved = join(dirname(recording.wavPath), 'recognised.json')
        const reused = method === 'audio' && reuse && existsSync(saved)
        let words: TimedWord[]
        if (method === 'captions') words = captionWords(captionFile(recording, { ...take.captions, seed: take.seed * 7 + (variant === 'plain' ? 0 : 1) }))
        else if (reused) words = JSON.parse(readFileSync(saved, 'utf8')) as TimedWord[]
        else {
          words = await recognise!(recording.wavPath, lines.map((l) => l.text))
          writeFileSync(saved, JSON.stringify(words))
        }
        const score = scoreOf(alignLines(lines, words), lines, performance, recording, cpuMs() - cpuBefore)
        const baseline = scoreOf(baselineAlign(lines, words), lines, performance, recording, 0)
        for (const [key, s] of [[`${variant} ${method}`, score], [`${variant} ${method}-base`, baseline]] as const) totals.set(key, add(totals.get(key), s))
        console.log(`${take.name.padEnd(25)}${variant.padEnd(13)}${method.padEnd(10)}${row(score)}${reused ? ' *' : ''}`)
      }
    }
  }
  console.log('\nall takes (…-base: the simple baseline on the same words; its CPU column is not measured)')
  for (const [key, score] of [...totals].sort(([a], [b]) => a.localeCompare(b))) {
    console.log(`${'all'.padEnd(25)}${key.split(' ')[0].padEnd(13)}${key.split(' ')[1].padEnd(14)}${row(score)}`)
  }
  speed()
}

/** The matcher alone on a long script: 2,000 lines (every fixture puzzle's lines) against an hour of words. */
function speed() {
  const lines: TakeLine[] = []
  for (const id of SPEED_PUZZLES) {
    for (const line of takeLines([id])) lines.push({ lineId: lines.length + 1, text: line.text })
    if (lines.length >= 2000) break
  }
  // a presenter at 160 words a minute with a second between lines, for an hour
  const words: TimedWord[] = []
  let t = 0
  for (const word of lines.flatMap((line) => ['', ...line.text.split(/\s+/)])) {
    if (t >= 3_600_000) break
    if (word === '') t += 1000
    else {
      words.push({ word, startMs: t, endMs: t + 300 })
      t += 375
    }
  }
  // CPU time, not wall time: the machine may be busy with other work; the first call includes compiling the matcher
  const cpu = () => {
    const before = process.cpuUsage()
    const result = alignLines(lines.slice(0, 2000), words)
    const used = process.cpuUsage(before)
    return { ms: (used.user + used.system) / 1000, placed: result.proposals.length }
  }
  const first = cpu()
  const again = cpu()
  console.log(`\nspeed: ${Math.min(2000, lines.length)} lines against an hour of words (${words.length}): ${first.ms.toFixed(0)} ms CPU on the first call, ${again.ms.toFixed(0)} ms after; ${again.placed} lines placed`)
}

/** The issue's baseline matcher: one order-preserving diff over the words, each line placed at its first matched word. */
function baselineAlign(lines: TakeLine[], heard: TimedWord[]): Alignment {
  const script = lines.flatMap((line) => spokenWords(line.text).map((word) => ({ word, lineId: line.lineId })))
  const said = heard.flatMap((w) => spokenWords(w.word).map((word) => ({ word, startMs: w.startMs })))
  const alike = (a: string, b: string) => a === b || (Math.min(a.length, b.length) >= 4 && distance(a, b) / Math.max(a.length, b.length) <= 0.25)
  const firstHeard = new Map<number, number>()
  let s = 0
  let r = 0
  const changes = diffArrays(
    script.map((w) => w.word),
    said.map((w) => w.word),
    { comparator: alike },
  )
  for (const change of changes) {
    if (change.added) r += change.count
    else if (change.removed) s += change.count
    else {
      for (let k = 0; k < change.count; k++) if (!firstHeard.has(script[s + k].lineId)) firstHeard.set(script[s + k].lineId, said[r + k].startMs)
      s += change.count
      r += change.count
    }
  }
  const proposals = lines.flatMap((l) => (firstHeard.has(l.lineId) ? [{ lineId: l.lineId, startMs: firstHeard.get(l.lineId)!, confidence: 1 }] : []))
  return { proposals, unplaced: lines.filter((l) => !firstHeard.has(l.lineId)).map((l) => l.lineId) }
}

function scoreOf(alignment: Alignment, lines: TakeLine[], performance: Performance, recording: Recording, cpu: number): Score {
  const truth = new Map(recording.spoken.filter((u) => u.lineId !== null).map((u) => [u.lineId!, u.startMs]))
  const placed = new Map(alignment.proposals.map((p) => [p.lineId, p.startMs]))
  let previous = -1
  for (const p of alignment.proposals) {
    if (p.startMs <= previous) throw new Error(`starts do not ascend at line ${p.lineId}`)
    previous = p.startMs
  }
  const score: Score = { lines: 0, within1: 0, within2: 0, wrong: 0, unplaced: 0, absent: performance.absent.length, absentPlaced: 0, audioMs: recording.durationMs, cpuMs: cpu }
  for (const line of lines) {
    const start = placed.get(line.lineId)
    const at = truth.get(line.lineId)
    if (at === undefined) {
      if (start !== undefined) score.absentPlaced++
      continue
    }
    score.lines++
    if (start === undefined) score.unplaced++
    else {
      const off = Math.abs(start - at)
      if (off <= 1000) score.within1++
      if (off <= 2000) score.within2++
      if (off > 5000) score.wrong++
    }
  }
  return score
}

function add(a: Score | undefined, b: Score): Score {
  if (!a) return { ...b }
  const sum = { ...a }
  for (const k of Object.keys(b) as (keyof Score)[]) sum[k] += b[k]
  return sum
}

function row(s: Score): string {
  const share = (n: number) => `${((100 * n) / Math.max(1, s.lines)).toFixed(1)}%`.padStart(6)
  const perMinute = s.cpuMs / 1000 / (s.audioMs / 60_000)
  return `${String(s.lines).padStart(5)}  ${share(s.within1)}  ${share(s.within2)}  ${share(s.wrong)}  ${share(s.unplaced)}  ${`${s.absentPlaced}/${s.absent}`.padStart(8)}      ${perMinute.toFixed(2).padStart(6)}`
}

/** CPU time of this process and of the children it has waited for (the recogniser runs as one), in ms. */
function cpuMs(): number {
  const own = process.cpuUsage()
  // /proc/self/stat fields 16 and 17: children's user and system time in clock ticks (100 a second on Linux)
  const fields = readFileSync('/proc/self/stat', 'utf8').split(') ')[1].split(' ')
  return (own.user + own.system) / 1000 + (Number(fields[13]) + Number(fields[14])) * 10
}

async function loadRecogniser(): Promise<Recognise | undefined> {
  const path = new URL('../server/speech/recognise.ts', import.meta.url)
  if (!existsSync(path)) return undefined
  const module = (await import(path.href)) as { recogniseWords: Recognise }
  return module.recogniseWords
}

function valueOf(args: string[], name: string): string | undefined {
  const at = args.indexOf(name)
  return at >= 0 ? args[at + 1] : undefined
}

await main()
