// The demo channel's published episode: the thermometer take from 02_demo_puzzles published as a public
// episode, with a recording of the take (espeak-ng's voice saying every visible line, encoded by ffmpeg)
// aligned to it, so a newcomer sees the whole job: the page's grid follows the voice to the last digit. Without espeak-ng, sox or ffmpeg the episode is published without a
// recording, at estimated times, and a line says why. Skipped once the episode exists.
import { execFileSync } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { createReadStream, existsSync, statSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import type { Knex } from 'knex'
import type { EpisodeVideoChoice } from '../shared/schemas/episode'
import { scriptOf, type Outline } from '../shared/schemas/outline'
import { toDescription } from '../shared/script/index'
import { loadConfig } from '../server/config'
import { DEMO_EPISODE_ADDRESS } from '../server/demo-episode'
import { findChannelBySlug } from '../server/db/channels'
import { findSlugHolder } from '../server/db/episodes'
import { outlineOf } from '../server/db/outlines'
import { insertRecording, savePeaks } from '../server/db/recordings'
import { findUserByEmail } from '../server/db/users'
import { computePeaks } from '../server/media/peaks'
import { probeMedia } from '../server/media/probe'
import { publishEpisode } from '../server/services/episodes'
import { saveOutline } from '../server/services/outlines'
import { createStorage, type Storage } from '../server/storage'
import { speak, type Recording as SpokenRecording } from '../scripts/test-recordings/speak'
import { DEMO_USERS } from './01_demo_channel'
import { DEMO_PUZZLES } from './02_demo_puzzles'

export const DEMO_EPISODE = { slug: DEMO_EPISODE_ADDRESS.episodeSlug, title: 'Four Fevers, one thermometer at a time' }

const WORDS_PER_MINUTE = 170
const PAUSE_MS = 700
// as the server's own waveforms (server/services/recordings.ts)
const PEAKS_PER_SECOND = 25
const MIME = 'audio/webm'
// the recordings are made once per checkout and reused: the text decides the folder (see speak())
const CACHE_DIR = fileURLToPath(new URL('../.data/demo-recording', import.meta.url))

/** `storage` is where the recording goes; by default the one the configuration names, as the server will read it. */
export async function seed(knex: Knex, storage?: Storage): Promise<void> {
  const channel = await findChannelBySlug(knex, DEMO_EPISODE_ADDRESS.channelSlug)
  if (!channel || (await findSlugHolder(knex, channel.id, DEMO_EPISODE.slug)) !== undefined) return
  const take = await knex('outlines')
    .join('puzzles', 'puzzles.id', 'outlines.puzzle_id')
    .where('puzzles.channel_id', channel.id)
    .andWhere('puzzles.title', DEMO_PUZZLES[1]!.title)
    .andWhere('outlines.name', 'First take')
    .first('outlines.*')
  const editor = await findUserByEmail(knex, DEMO_USERS.find((u) => u.role === 'editor')!.email)
  if (!take || !editor) return
  const user = { id: editor.id, email: editor.email, name: editor.name }
  const outline = outlineOf(take)

  const voice = await recordTheTake(storage, channel.id, outline).catch((error: unknown) => {
    console.log(`[gridcue] the demo episode is published without a recording, at estimated times: ${reasonOf(error)}`)
    return null
  })
  try {
    await knex.transaction(async (trx) => {
      let published = outline
      let video: EpisodeVideoChoice = { kind: 'none' }
      if (voice) {
        const recordingId = await insertRecording(trx, { ...voice.row, outline_id: take.id, uploaded_by: editor.id })
        await savePeaks(trx, recordingId, voice.row.storage_key, voice.peaks)
        published = alignedTo(outline, voice.starts)
        await saveOutline(trx, channel.id, take.id, { version: take.version, script: scriptOf(published) }, user)
        video = { kind: 'recording', recordingId }
      }
      // demo data is no news: nobody is notified (a mail would also start the local mail catcher in the seeding process)
      await publishEpisode(trx, channel.id, take.id, { ...DEMO_EPISODE, visibility: 'public', description: toDescription(published), video }, user, { announce: false })
    })
  } catch (error) {
    await voice?.discard()
    throw error
  }
}

/**
 * Speaks every visible line of the take and stores the recording: what its row holds, its waveform, where
 * each spoken line starts in it (the generator knows to the sample), and how to remove it again.
 */
async function recordTheTake(given: Storage | undefined, channelId: number, outline: Outline) {
  const storage = given ?? createStorage(loadConfig().storage)
  const said = outline.lines.filter((l) => !l.hidden)
  const spoken = speak({ utterances: said.map((l) => ({ lineId: l.id, text: l.text, pauseMs: PAUSE_MS })), absent: [] }, WORDS_PER_MINUTE, CACHE_DIR)
  const file = webAudioOf(spoken)
  const [probed, peaks] = await Promise.all([probeMedia(file), computePeaks(file, { perSecond: PEAKS_PER_SECOND })])
  const key = `recordings/${channelId}/${randomUUID()}.webm`
  const { sizeBytes } = await storage.put(key, createReadStream(file), { contentType: MIME })
  const row = {
    storage_key: key,
    original_name: 'demo-voice.webm',
    mime: MIME,
    kind: 'audio' as const,
    size_bytes: sizeBytes,
    duration_ms: probed.durationMs ?? spoken.durationMs,
    facts: probed.facts,
  }
  return { row, peaks, discard: () => storage.remove(key), starts: new Map(spoken.spoken.flatMap((u) => (u.lineId === null ? [] : [[u.lineId, u.startMs] as const]))) }
}

/** The outline with every spoken line aligned where it is said. */
function alignedTo(outline: Outline, starts: ReadonlyMap<number, number>): Outline {
  return { ...outline, lines: outline.lines.map((l) => (starts.has(l.id) ? { ...l, alignedStartMs: starts.get(l.id)! } : l)) }
}

/** The spoken WAV as Opus in WebM (mono, 32 kbit/s): small, and every current browser plays it. Made once beside the WAV. */
function webAudioOf(spoken: SpokenRecording): string {
  const webm = join(dirname(spoken.wavPath), 'demo-voice.webm')
  if (existsSync(webm) && statSync(webm).size > 0) return webm
  execFileSync('ffmpeg', ['-nostdin', '-v', 'error', '-y', '-i', spoken.wavPath, '-ac', '1', '-c:a', 'libopus', '-b:a', '32k', webm])
  return webm
}

/** A missing tool said as such; anything else as its own message. */
function reasonOf(error: unknown): string {
  const { code, path, message } = error as { code?: string; path?: string; message?: string }
  if (code === 'ENOENT' && path) return `${path} is not installed (scripts/lib/setup.sh installs espeak-ng, sox and ffmpeg from Debian's packages)`
  return message ?? String(error)
}
