import { runTool } from './run-tool'

export const FFMPEG_INSTALL_HINT = 'npm start installs it; or run: apt-get install -y ffmpeg'

interface ProbedStream {
  type: 'audio' | 'video'
  codec: string
  sampleRate?: number
  channels?: number
  width?: number
  height?: number
}

export interface ProbedFile {
  formatName: string
  durationMs: number | null
  bitrate?: number
  streams: ProbedStream[]
}

interface FfprobeJson {
  format?: { format_name?: string; duration?: string; bit_rate?: string }
  streams?: { codec_type?: string; codec_name?: string; sample_rate?: string; channels?: number; width?: number; height?: number; disposition?: { attached_pic?: number } }[]
}

/** The container and streams as ffprobe reads them from the header (no decoding). */
export async function ffprobeFile(path: string, signal?: AbortSignal): Promise<ProbedFile> {
  const json = await runTool(
    'ffprobe',
    ['-v', 'error', '-show_entries', 'format=format_name,duration,bit_rate:stream=codec_type,codec_name,sample_rate,channels,width,height:stream_disposition=attached_pic', '-of', 'json', path],
    { signal, installHint: FFMPEG_INSTALL_HINT },
  )
  const parsed = JSON.parse(json) as FfprobeJson
  const streams: ProbedStream[] = []
  for (const stream of parsed.streams ?? []) {
    // cover art inside an audio file is a "video" stream of one picture
    if (stream.disposition?.attached_pic) continue
    if (stream.codec_type !== 'audio' && stream.codec_type !== 'video') continue
    streams.push({
      type: stream.codec_type,
      codec: stream.codec_name ?? 'unknown',
      ...(stream.sample_rate ? { sampleRate: Number(stream.sample_rate) } : {}),
      ...(stream.channels ? { channels: stream.channels } : {}),
      ...(stream.width ? { width: stream.width, height: stream.height } : {}),
    })
  }
  const seconds = Number(parsed.format?.duration)
  const bitrate = Number(parsed.format?.bit_rate)
  return {
    formatName: parsed.format?.format_name ?? 'unknown',
    durationMs: Number.isFinite(seconds) && seconds > 0 ? Math.round(seconds * 1000) : null,
    ...(Number.isFinite(bitrate) && bitrate > 0 ? { bitrate } : {}),
    streams,
  }
}

/**
 * The end of the last packet, for files whose header carries no duration (a browser's recorder
 * streams WebM and never goes back to write it). Reads packet headers only, streamed: an hour takes
 * well under a second.
 */
export async function durationFromPackets(path: string, signal?: AbortSignal): Promise<number | null> {
  let endSeconds = 0
  let partialLine = ''
  const takeLine = (line: string) => {
    const [pts, duration] = line.split(',').map(Number)
    if (Number.isFinite(pts)) endSeconds = Math.max(endSeconds, pts + (Number.isFinite(duration) ? duration : 0))
  }
  await runTool('ffprobe', ['-v', 'error', '-show_entries', 'packet=pts_time,duration_time', '-of', 'csv=p=0', path], {
    signal,
    installHint: FFMPEG_INSTALL_HINT,
    onStdout: (chunk) => {
      const lines = (partialLine + chunk.toString('latin1')).split('\n')
      partialLine = lines.pop() ?? ''
      lines.forEach(takeLine)
    },
  })
  takeLine(partialLine)
  return endSeconds > 0 ? Math.round(endSeconds * 1000) : null
}
