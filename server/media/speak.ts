import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { runTool } from './run-tool'

/** A preview that takes longer than this to make is given up: a dozen lines take espeak-ng well under a second. */
const SPEAK_TIMEOUT_MS = 15_000

/**
 * Text read aloud by Debian's espeak-ng as a WAV file, at `wordsPerMinute` (its `-s` option is words per
 * minute, per its manual page; it speaks no slower than 80). Runs as a child process with a time limit;
 * the text goes through a file, so no line of a script is ever read as one of its options.
 */
export async function speakToWav(text: string, wordsPerMinute: number): Promise<Buffer> {
  const dir = await mkdtemp(join(tmpdir(), 'gridcue-speak-'))
  try {
    const input = join(dir, 'text.txt')
    const output = join(dir, 'speech.wav')
    await writeFile(input, text, 'utf8')
    await runTool('espeak-ng', ['-v', 'en-us', '-s', String(Math.round(wordsPerMinute)), '-f', input, '-w', output], {
      signal: AbortSignal.timeout(SPEAK_TIMEOUT_MS),
      installHint: 'Install it with: sudo apt-get install espeak-ng',
    })
    return await readFile(output)
  } finally {
    await rm(dir, { recursive: true, force: true })
  }
}
