import { parseFile, type IAudioMetadata } from 'music-metadata'
import { durationFromPackets, ffprobeFile, type ProbedFile } from './ffprobe'
import { MediaToolError } from './run-tool'
import { codecName, containerFamily, durationLivesInHeader, playsInBrowsers } from './web-playable'

export interface MediaFacts {
  kind: 'audio' | 'video'
  durationMs: number | null
  /** the file won't play (well) in a browser as it is: see remuxForWeb */
  needsRemux: boolean
  /** container, codecs, sample rate, channels, size, bitrate: small and JSON-safe, for people and logs */
  facts: Record<string, unknown>
}

/**
 * Duration and stream facts of a stored recording. music-metadata reads the common audio files in
 * process; ffprobe (a child process) takes over when it throws, finds no duration (a browser's
 * recorder writes WebM without one) or meets video, whose codec and size it doesn't report for MP4.
 */
export async function probeMedia(path: string, options: { signal?: AbortSignal } = {}): Promise<MediaFacts> {
  const metadata = await parseFile(path, { duration: true }).catch(() => null)
  options.signal?.throwIfAborted()
  if (metadata?.format.duration && !metadata.format.hasVideo) return fromMusicMetadata(metadata)
  const probed = await ffprobeFile(path, options.signal).catch((error: unknown) => {
    if (error instanceof MediaToolError && error.tool === 'ffprobe' && !error.message.includes('not installed')) {
      throw new MediaToolError('ffprobe', `This file could not be read as audio or video (${error.message}).`)
    }
    throw error
  })
  return fromFfprobe(path, probed, metadata, options.signal)
}

function fromMusicMetadata({ format }: IAudioMetadata): MediaFacts {
  const container = format.container ?? 'unknown'
  const audioCodec = codecName(format.codec ?? 'unknown', format.bitsPerSample)
  return {
    kind: 'audio',
    durationMs: Math.round((format.duration ?? 0) * 1000),
    needsRemux: !playsInBrowsers(containerFamily(container), [], [audioCodec]),
    facts: jsonSafe({
      container,
      audioCodec,
      sampleRate: format.sampleRate,
      channels: format.numberOfChannels,
      bitrate: format.bitrate === undefined ? undefined : Math.round(format.bitrate),
    }),
  }
}

async function fromFfprobe(path: string, probed: ProbedFile, metadata: IAudioMetadata | null, signal?: AbortSignal): Promise<MediaFacts> {
  const video = probed.streams.filter((stream) => stream.type === 'video')
  const audio = probed.streams.filter((stream) => stream.type === 'audio')
  if (video.length === 0 && audio.length === 0) throw new MediaToolError('ffprobe', 'This file holds no audio or video stream.')
  // ffprobe names Matroska and WebM alike; music-metadata reads the document type that tells them apart
  const container = metadata?.format.container ?? probed.formatName
  const family = containerFamily(container)
  const fromHeader = probed.durationMs ?? (metadata?.format.duration ? Math.round(metadata.format.duration * 1000) : null)
  const durationMs = fromHeader ?? (await durationFromPackets(path, signal))
  const missingHeaderDuration = fromHeader === null && durationLivesInHeader(family)
  const codecsOf = (streams: typeof audio) => streams.map((stream) => stream.codec)
  const [firstVideo] = video
  const [firstAudio] = audio
  return {
    kind: video.length > 0 ? 'video' : 'audio',
    durationMs,
    needsRemux: missingHeaderDuration || !playsInBrowsers(family, codecsOf(video), codecsOf(audio)),
    facts: jsonSafe({
      container,
      videoCodec: firstVideo?.codec,
      width: firstVideo?.width,
      height: firstVideo?.height,
      audioCodec: firstAudio?.codec,
      sampleRate: firstAudio?.sampleRate,
      channels: firstAudio?.channels,
      bitrate: probed.bitrate,
      ...(missingHeaderDuration ? { durationFrom: 'packets' } : {}),
    }),
  }
}

function jsonSafe(facts: Record<string, string | number | undefined>): Record<string, string | number> {
  return Object.fromEntries(Object.entries(facts).filter((entry): entry is [string, string | number] => entry[1] !== undefined && entry[1] !== ''))
}
