import { captionWords, CaptionFileError } from '../captions/caption-words'
import { MediaToolError } from '../media/run-tool'
import { recogniseWords } from '../speech/recognise'
import type { Storage } from '../storage'
import type { WordSources } from './alignment-job'

/** The product's word sources: the caption parser, and the recogniser on a local copy of the stored recording. */
export function wordSources(storage: Storage): WordSources {
  return {
    captions: captionWords,
    audio: (storageKey, lineTexts, options) => storage.withLocalFile(storageKey, (path) => recogniseWords(path, lineTexts, options)),
    // these two speak to people (a file that isn't captions, a recording ffmpeg can't read, a missing tool)
    explain: (error) => (error instanceof CaptionFileError || error instanceof MediaToolError ? error.message : undefined),
  }
}
