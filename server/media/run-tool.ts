import { spawn } from 'node:child_process'
import { getPriority, setPriority } from 'node:os'

/** A media tool (ffmpeg, ffprobe, pocketsphinx…) failed; the message is meant for a person. */
export class MediaToolError extends Error {
  constructor(
    readonly tool: string,
    message: string,
  ) {
    super(message)
    this.name = 'MediaToolError'
  }
}

export interface RunToolOptions {
  /** aborting kills the child and rejects with the signal's reason */
  signal?: AbortSignal
  /** receives stdout as it arrives; without it stdout is collected and returned */
  onStdout?: (chunk: Buffer) => void
  /** receives stderr as it arrives, for tools that report their progress there */
  onStderr?: (chunk: Buffer) => void
  /** how to install the tool, said when it is missing */
  installHint?: string
  /** background work (an hour of audio to decode or recognise) yields the CPU to requests */
  background?: boolean
}

// enough of stderr to explain a failure; tools like ffmpeg print a banner and per-frame progress there
const STDERR_TAIL_CHARS = 4000

/**
 * Runs a tool as a child process without blocking the event loop. Resolves with its stdout (empty when
 * onStdout took it) when it exits with 0; rejects with a MediaToolError (missing tool, non-zero exit) or the abort reason.
 */
export function runTool(command: string, args: readonly string[], options: RunToolOptions = {}): Promise<string> {
  const { signal, onStdout, onStderr, installHint, background } = options
  return new Promise((resolve, reject) => {
    if (signal?.aborted) {
      reject(signal.reason)
      return
    }
    const child = spawn(command, args, { stdio: ['ignore', 'pipe', 'pipe'] })
    if (background && child.pid !== undefined) lowerPriority(child.pid)
    const stdoutChunks: Buffer[] = []
    let stderrTail = ''
    // an abort, or a consumer that throws, must not leave the child running: the failure ends it
    let failure: unknown
    const fail = (error: unknown) => {
      if (failure !== undefined) return
      failure = error
      child.kill('SIGKILL')
    }
    const consume = (consumer: (chunk: Buffer) => void, chunk: Buffer) => {
      try {
        consumer(chunk)
      } catch (error) {
        fail(error)
      }
    }
    child.stdout.on('data', (chunk: Buffer) => (onStdout ? consume(onStdout, chunk) : stdoutChunks.push(chunk)))
    child.stderr.on('data', (chunk: Buffer) => {
      stderrTail = (stderrTail + chunk.toString('utf8')).slice(-STDERR_TAIL_CHARS)
      if (onStderr) consume(onStderr, chunk)
    })
    const onAbort = () => fail(signal?.reason)
    signal?.addEventListener('abort', onAbort, { once: true })
    child.stdout.on('error', fail)

    child.on('error', (error: NodeJS.ErrnoException) => {
      signal?.removeEventListener('abort', onAbort)
      if (error.code === 'ENOENT') {
        reject(new MediaToolError(command, `${command} is not installed on this server.${installHint ? ` ${installHint}` : ''}`))
      } else reject(error)
    })
    child.on('close', (code, killedBy) => {
      signal?.removeEventListener('abort', onAbort)
      if (failure !== undefined) return reject(failure)
      if (code === 0) return resolve(Buffer.concat(stdoutChunks).toString('utf8'))
      reject(new MediaToolError(command, `${command} failed (${killedBy ?? `exit ${code}`}): ${lastMeaningfulLine(stderrTail)}`))
    })
  })
}

// 10 steps nicer (Linux nice values run -20..19): the child still gets every idle cycle
function lowerPriority(pid: number): void {
  try {
    setPriority(pid, Math.min(19, getPriority(pid) + 10))
  } catch {
    // it has already ended; the close event reports how
  }
}

// tools that log as they go (pocketsphinx) mark the line that explains a failure
function lastMeaningfulLine(stderr: string): string {
  const lines = stderr.split(/\r?\n/).map((line) => line.trim()).filter(Boolean)
  return lines.findLast((line) => /^(ERROR|FATAL)/.test(line)) ?? lines.at(-1) ?? 'no explanation given'
}
