import { ffprobeFile, FFMPEG_INSTALL_HINT } from './ffprobe'
import { runTool } from './run-tool'

interface WebPlayableFile {
  /** what to serve the new file as */
  mime: string
  /** false when the streams were only copied into a fresh container (fast, lossless) */
  transcoded: boolean
}

const WEBM_VIDEO = new Set(['vp8', 'vp9', 'av1'])
const WEBM_AUDIO = new Set(['opus', 'vorbis'])
// the containers an audio codec is copied into as it is
const AUDIO_COPY_TARGETS: Record<string, { format: string; mime: string }> = {
  opus: { format: 'webm', mime: 'audio/webm' },
  vorbis: { format: 'webm', mime: 'audio/webm' },
  aac: { format: 'mp4', mime: 'audio/mp4' },
  mp3: { format: 'mp3', mime: 'audio/mpeg' },
  flac: { format: 'flac', mime: 'audio/flac' },
}

/**
 * How to make a copy of the recording that every browser plays and can seek in, keeping the first video and
 * audio stream. When the codecs already play, the streams are copied into a fresh container (`-c copy`):
 * that writes the duration and seek index a browser's recorder leaves out, in a fraction of a second.
 * Otherwise it transcodes, to H.264 video and AAC audio in MP4: the one pairing every browser engine
 * plays (Opus would be smaller, but older WebKit plays no WebM). A transcode runs at about the length of
 * the recording or longer, so callers do it after answering (see server/services/playback.ts).
 */
export async function planWebCopy(inPath: string, options: { signal?: AbortSignal } = {}): Promise<WebCopyPlan> {
  const { streams } = await ffprobeFile(inPath, options.signal)
  const videoCodec = streams.find((stream) => stream.type === 'video')?.codec
  const audioCodec = streams.find((stream) => stream.type === 'audio')?.codec
  return videoCodec ? videoPlan(videoCodec, audioCodec) : audioPlan(audioCodec)
}

/** Writes the planned copy; the format is the plan's, whatever outPath's extension says. */
export async function writeWebCopy(inPath: string, outPath: string, plan: WebCopyPlan, options: { signal?: AbortSignal } = {}): Promise<void> {
  await runTool(
    'ffmpeg',
    ['-nostdin', '-v', 'error', '-y', '-i', inPath, '-map', '0:v:0?', '-map', '0:a:0?', '-sn', '-dn', ...plan.codecArgs, ...plan.formatArgs, outPath],
    { signal: options.signal, installHint: FFMPEG_INSTALL_HINT },
  )
}

export interface WebCopyPlan extends WebPlayableFile {
  codecArgs: string[]
  formatArgs: string[]
}

// the index at the front, so playback starts before the whole file has arrived
const MP4 = ['-movflags', '+faststart', '-f', 'mp4']
const AAC = ['-c:a', 'aac', '-b:a', '160k']

function videoPlan(videoCodec: string, audioCodec: string | undefined): WebCopyPlan {
  if (WEBM_VIDEO.has(videoCodec) && (!audioCodec || WEBM_AUDIO.has(audioCodec))) {
    return { mime: 'video/webm', transcoded: false, codecArgs: ['-c', 'copy'], formatArgs: ['-f', 'webm'] }
  }
  const copyVideo = videoCodec === 'h264'
  const copyAudio = !audioCodec || audioCodec === 'aac' || audioCodec === 'mp3'
  return {
    mime: 'video/mp4',
    transcoded: !copyVideo || !copyAudio,
    codecArgs: [
      ...(copyVideo ? ['-c:v', 'copy'] : ['-c:v', 'libx264', '-preset', 'veryfast', '-crf', '23', '-pix_fmt', 'yuv420p']),
      ...(copyAudio ? ['-c:a', 'copy'] : AAC),
    ],
    formatArgs: MP4,
  }
}

function audioPlan(audioCodec: string | undefined): WebCopyPlan {
  const copyTarget = audioCodec ? AUDIO_COPY_TARGETS[audioCodec] : undefined
  if (copyTarget) {
    const formatArgs = copyTarget.format === 'mp4' ? MP4 : ['-f', copyTarget.format]
    return { mime: copyTarget.mime, transcoded: false, codecArgs: ['-c:a', 'copy'], formatArgs }
  }
  return { mime: 'audio/mp4', transcoded: true, codecArgs: AAC, formatArgs: MP4 }
}
