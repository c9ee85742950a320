/**
 * recogniseWords on synthetic speech: espeak-ng says one line of a small take after half a second of
 * silence (sox), so the words, their order and where speech starts are known from outside;
 * pocketsphinx (Debian's, with its US English model) hears them.
 */
import { execFile } from 'node:child_process'
import { readdir } from 'node:fs/promises'
import { tmpdir } from 'node:os'
import { promisify } from 'node:util'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { recogniseWords } from '../../../server/speech/recognise'
import { spokenWords } from '../../../shared/align/words'
import { mediaFolder, spokenWav, type MediaFolder } from '../media/make-media'

const TAKE = [
  'Hello and welcome. This is a thermometer puzzle by Ada Wren.',
  'There is only one place for a 7 in this box: r3c5.',
  'The bulb of that thermometer can’t be more than 4, so the tip is 6 or more.',
  'That finishes the top-left box: 2, 6 and 9.',
]
const SAID = TAKE[3]
const SILENCE_SECONDS = 0.5

let folder: MediaFolder
let speech: string
beforeAll(async () => {
  folder = await mediaFolder()
  speech = await spokenWav(folder.path('line.wav'), SAID, SILENCE_SECONDS)
})
afterAll(() => folder.remove())

const ourTempFolders = async () => (await readdir(tmpdir())).filter((name) => name.startsWith('gridcue-speech-'))

describe('recogniseWords', () => {
  it('should hear the line’s words in order, each later than the one before', async () => {
    const before = await ourTempFolders()
    const progress: number[] = []
    const words = await recogniseWords(speech, TAKE, { onProgress: (share) => progress.push(share) })
    expect(words.map((word) => word.word)).toEqual(spokenWords(SAID))
    // a word's edges sit somewhere in the quiet around it: a quarter of a second either way
    expect(Math.abs(words[0].startMs - SILENCE_SECONDS * 1000)).toBeLessThanOrEqual(250)
    words.forEach((word, i) => {
      expect(word.endMs).toBeGreaterThan(word.startMs)
      if (i > 0) expect(word.startMs).toBeGreaterThanOrEqual(words[i - 1].endMs)
    })
    expect(progress.length).toBeGreaterThan(0)
    expect(progress).toEqual([...progress].sort((a, b) => a - b))
    expect(progress.at(-1)).toBeGreaterThan(0.8)
    expect(await ourTempFolders()).toEqual(before)
  })

  it('should stop when aborted and leave no temporary files', async () => {
    const before = await ourTempFolders()
    const fifo = folder.path('never-written.fifo')
    await promisify(execFile)('mkfifo', [fifo])
    const controller = new AbortController()
    const recognising = recogniseWords(fifo, TAKE, { signal: controller.signal })
    setTimeout(() => controller.abort(new Error('the editor cancelled')), 300)
    await expect(recognising).rejects.toThrow('the editor cancelled')
    expect(await ourTempFolders()).toEqual(before)
  })
})
