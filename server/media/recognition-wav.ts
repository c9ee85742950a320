import { FFMPEG_INSTALL_HINT } from './ffprobe'
import { runTool } from './run-tool'

/** The sample rate the speech recogniser's acoustic model was trained on. */
const RECOGNITION_SAMPLE_RATE = 16000

/** Writes the recording's first audio stream as 16 kHz mono 16-bit WAV, what the speech recogniser reads. */
export async function toRecognitionWav(inPath: string, outPath: string, options: { signal?: AbortSignal } = {}): Promise<void> {
  await runTool(
    'ffmpeg',
    ['-nostdin', '-v', 'error', '-y', '-i', inPath, '-map', '0:a:0', '-ac', '1', '-ar', String(RECOGNITION_SAMPLE_RATE), '-c:a', 'pcm_s16le', '-f', 'wav', outPath],
    { signal: options.signal, installHint: FFMPEG_INSTALL_HINT, background: true },
  )
}
