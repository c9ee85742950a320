/**
 * What a browser's <video>/<audio> element plays in every current engine (Chromium, Gecko, WebKit),
 * by container family and codec. Names are ffprobe's codec names; other readers' names are mapped to them.
 */
export type ContainerFamily = 'mp4' | 'webm' | 'matroska' | 'ogg' | 'mp3' | 'wav' | 'flac' | 'aac' | 'other'

const PLAYABLE: Record<ContainerFamily, { video: ReadonlySet<string>; audio: ReadonlySet<string> }> = {
  mp4: { video: new Set(['h264', 'av1']), audio: new Set(['aac', 'mp3', 'opus', 'flac']) },
  webm: { video: new Set(['vp8', 'vp9', 'av1']), audio: new Set(['opus', 'vorbis']) },
  // Matroska proper (.mkv) is not a container browsers promise to play, even with WebM's codecs
  matroska: { video: new Set(), audio: new Set() },
  ogg: { video: new Set(), audio: new Set(['opus', 'vorbis', 'flac']) },
  mp3: { video: new Set(), audio: new Set(['mp3']) },
  wav: { video: new Set(), audio: new Set(['pcm_s16le', 'pcm_u8', 'pcm_f32le', 'pcm_s24le', 'pcm_s32le']) },
  flac: { video: new Set(), audio: new Set(['flac']) },
  aac: { video: new Set(), audio: new Set(['aac']) },
  other: { video: new Set(), audio: new Set() },
}

/** True when every stream's codec plays in a browser inside this container. */
export function playsInBrowsers(container: ContainerFamily, videoCodecs: readonly string[], audioCodecs: readonly string[]): boolean {
  const playable = PLAYABLE[container]
  return videoCodecs.every((codec) => playable.video.has(codec)) && audioCodecs.every((codec) => playable.audio.has(codec))
}

/** Only Matroska-family files can lack a duration in their header (browser recorders write them as a stream). */
export const durationLivesInHeader = (container: ContainerFamily) => container === 'webm' || container === 'matroska'

/** ffprobe's format name (e.g. "mov,mp4,m4a,3gp,3g2,mj2") or music-metadata's container (e.g. "EBML/webm", "isom/iso2/mp41"). */
export function containerFamily(name: string): ContainerFamily {
  const lower = name.toLowerCase()
  if (lower === 'ebml/webm' || lower === 'webm') return 'webm'
  if (lower.startsWith('ebml') || lower.startsWith('matroska')) return 'matroska'
  // QuickTime (.mov, brand "qt") shares the demuxer but only some browsers take it: remux it to MP4
  if (lower.startsWith('qt') || lower === 'quicktime') return 'other'
  if (lower.startsWith('mov,mp4') || /^(isom|iso\d|mp4\d|m4a|m4v|avc1|dash|mp41|mp42)/.test(lower)) return 'mp4'
  if (lower === 'ogg') return 'ogg'
  if (lower === 'mp3' || lower === 'mpeg') return 'mp3'
  if (lower === 'wav' || lower === 'wave') return 'wav'
  if (lower === 'flac') return 'flac'
  if (lower === 'aac' || lower === 'adts') return 'aac'
  return 'other'
}

// music-metadata's codec names where they differ from ffprobe's
const MUSIC_METADATA_CODECS: Record<string, string> = {
  'mpeg-4/aac': 'aac',
  'mpeg 1 layer 3': 'mp3',
  'mpeg 2 layer 3': 'mp3',
  'mpeg 2.5 layer 3': 'mp3',
  avc1: 'h264',
  avc3: 'h264',
  hvc1: 'hevc',
  hev1: 'hevc',
  vp08: 'vp8',
  vp09: 'vp9',
  av01: 'av1',
}

/** A codec name from music-metadata ("MPEG-4/AAC", "<avc1>", "OPUS", "PCM") as ffprobe would name it. */
export function codecName(name: string, bitsPerSample?: number): string {
  const lower = name.toLowerCase().replace(/^<|>$/g, '').trim()
  if (lower === 'pcm') return bitsPerSample === 8 ? 'pcm_u8' : `pcm_s${bitsPerSample ?? 16}le`
  if (lower === 'ieee_float') return `pcm_f${bitsPerSample ?? 32}le`
  return MUSIC_METADATA_CODECS[lower] ?? lower
}
