import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises'
import { availableParallelism, tmpdir } from 'node:os'
import { join } from 'node:path'
import type { TimedWord } from '../../shared/align/types'
import { spokenWords } from '../../shared/align/words'
import { toRecognitionWav } from '../media/recognition-wav'
import { runTool } from '../media/run-tool'
import { dictionaryText, loadPronunciations, MODEL_DIR, SPHINX_INSTALL_HINT, takePronunciations } from './dictionary'
import { buildLanguageModel, FILLER_WORDS } from './language-model'
import { readSegmentation, UtteranceLog, utteranceId } from './segmentation-reader'
import { findSpeech } from './segments'

export interface RecogniseOptions {
  /** aborting kills ffmpeg or the recogniser and rejects with the signal's reason */
  signal?: AbortSignal
  /** share of the audio recognised so far, 0..1, called as it grows */
  onProgress?: (share: number) => void
}

// Tuned on 7 minutes of synthetic speech of a generated take (word accuracy, CPU per minute of audio):
// pocketsphinx's defaults 92.3 %, 4.1 s. Weighing the take's model more (lw 8, its final pass 11) and
// scoring 8 Gaussians a frame instead of 4 gain 2 points; skipping the second, flat-lexicon pass costs
// 1 point and saves a third of the time.
const SEARCH_SETTINGS = ['-lw', '8', '-bestpathlw', '11', '-topn', '8', '-fwdflat', 'no']

// pocketsphinx uses one core. Utterances are recognised independently (each has its own start and its
// own cepstral mean), so halves of a long recording run side by side with the same result, in half the
// time; below a few minutes loading the model twice isn't worth it.
const PARALLEL_FROM_MS = 3 * 60_000
const PARTS = Math.max(1, Math.min(2, availableParallelism()))

function partsOf(segmentCount: number, speechFrames: number): { offset: number; count: number }[] {
  const parts = speechFrames * FRAME_MS >= PARALLEL_FROM_MS ? Math.min(PARTS, segmentCount) : 1
  const size = Math.ceil(segmentCount / parts)
  return Array.from({ length: parts }, (_, part) => ({ offset: part * size, count: Math.min(size, segmentCount - part * size) }))
}
const FRAME_MS = 10

/**
 * The words said in a recording, each with its time, recognised offline by pocketsphinx with a
 * language model made from the take's own lines (see buildLanguageModel), so it hears the script
 * rather than English at large. Takes about 3.5 s of CPU per minute of recording, at a lowered
 * priority; call it from a job, not a request.
 */
export async function recogniseWords(mediaPath: string, scriptTexts: string[], options: RecogniseOptions = {}): Promise<TimedWord[]> {
  const { signal, onProgress } = options
  const folder = await mkdtemp(join(tmpdir(), 'gridcue-speech-'))
  try {
    const audio = join(folder, 'audio.wav')
    const dictionary = join(folder, 'take.dict')
    const model = join(folder, 'take.lm')
    const take = takePronunciations([...scriptTexts.flatMap(spokenWords), ...FILLER_WORDS], await loadPronunciations())
    await writeFile(dictionary, dictionaryText(take))
    await writeFile(model, buildLanguageModel(scriptTexts, new Set(take.keys())))
    await toRecognitionWav(mediaPath, audio, { signal })
    const { dataOffset, segments } = await findSpeech(audio)
    if (segments.length === 0) return []
    const control = join(folder, 'segments.ctl')
    await writeFile(control, segments.map(({ startFrame, endFrame }, i) => `audio ${startFrame} ${endFrame} ${utteranceId(i)}\n`).join(''))
    const totalFrames = segments.reduce((sum, { startFrame, endFrame }) => sum + endFrame - startFrame + 1, 0)
    const logs: UtteranceLog[] = []
    let reported = 0
    const reportProgress = () => {
      const share = logs.reduce((sum, log) => sum + log.decodedFrames, 0) / totalFrames
      if (onProgress && share > reported) onProgress((reported = share))
    }
    // one failure (or the caller's abort) stops every part
    const stopAll = new AbortController()
    const stop = () => stopAll.abort(signal?.reason)
    signal?.addEventListener('abort', stop, { once: true })
    if (signal?.aborted) stop()
    try {
      const parts = await Promise.all(
        partsOf(segments.length, totalFrames).map(async ({ offset, count }, part) => {
          const log = new UtteranceLog(segments)
          logs.push(log)
          const hypotheses = join(folder, `words-${part}.seg`)
          await runTool(
            'pocketsphinx_batch',
            [
              ...['-adcin', 'yes', '-cepdir', folder, '-cepext', '.wav', '-adchdr', String(dataOffset)],
              ...['-ctl', control, '-ctloffset', String(offset), '-ctlcount', String(count), '-hypseg', hypotheses],
              ...['-hmm', `${MODEL_DIR}/en-us`, '-dict', dictionary, '-lm', model, ...SEARCH_SETTINGS],
            ],
            {
              signal: stopAll.signal,
              installHint: SPHINX_INSTALL_HINT,
              background: true,
              onStderr: (chunk) => {
                if (log.take(chunk)) reportProgress()
              },
            },
          ).catch((error: unknown) => {
            stopAll.abort(error)
            throw error
          })
          return readSegmentation(await readFile(hypotheses, 'utf8'), segments)
        }),
      )
      return parts.flat()
    } finally {
      signal?.removeEventListener('abort', stop)
    }
  } finally {
    await rm(folder, { recursive: true, force: true })
  }
}
