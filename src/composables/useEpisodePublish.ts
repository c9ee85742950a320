import { computed, reactive, ref, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useQuery, useQueryClient } from '@tanstack/vue-query'
import { episodePublishSchema } from '@shared/schemas/episode'
import type { Episode, EpisodePublish, EpisodeVideoChoice, EpisodeVisibility } from '@shared/schemas/episode'
import type { Recording } from '@shared/schemas/recording'
import { toDescription, type Outline } from '@shared/script'
import { getTakeEpisode, publishEpisode, unpublishEpisode } from '@/api/episodes'
import { isApiError } from '@/api/http'
import { episodeKeys, recordingKeys } from '@/api/queryKeys'
import { listRecordings } from '@/api/recordings'
import { useSessionStore } from '@/stores/session'

/** The publish form as a person fills it in. */
interface EpisodeForm {
  title: string
  slug: string
  visibility: EpisodeVisibility
  when: 'now' | 'later'
  publishAt: Date | null
  description: string
  video: EpisodeVideoChoice['kind']
  videoUrl: string
}

export type EpisodeField = 'title' | 'slug' | 'publishAt' | 'description' | 'videoUrl'

interface EpisodePublishOptions {
  channelId: MaybeRefOrGetter<number>
  outlineId: MaybeRefOrGetter<number>
  /** the take as edited now: its title and generated description fill a first publish */
  outline: () => Outline | null
  /** the episode and the take's recordings are fetched only while the form is open */
  active: MaybeRefOrGetter<boolean>
  /** the server publishes the saved take, so edits still on their way are saved first */
  saveFirst: () => Promise<void>
}

/** Longest address name the contract takes. */
const SLUG_MAX = 80

// where a refused field of the request body shows its message
const FIELD_OF: Record<string, EpisodeField> = {
  title: 'title',
  slug: 'slug',
  publishAt: 'publishAt',
  description: 'description',
  video: 'videoUrl',
}

/**
 * Publishing a take as an episode from the studio: the take's episode (null when never published), the form
 * filled from it or from the take, the page's address as the slug is typed, and publish / unpublish with the
 * server's refusals placed at their field. Input is never cleared by a failure.
 */
export function useEpisodePublish({ channelId, outlineId, outline, active, saveFirst }: EpisodePublishOptions) {
  const client = useQueryClient()
  const session = useSessionStore()

  const episodeQuery = useQuery({
    queryKey: () => episodeKeys.byOutline(toValue(channelId), toValue(outlineId)),
    queryFn: ({ signal }) => takeEpisodeOrNull(toValue(channelId), toValue(outlineId), signal),
    enabled: () => toValue(active),
    // asked afresh at each opening: whether the take changed since publishing follows the studio's saves
    staleTime: 0,
  })
  const recordingsQuery = useQuery({
    queryKey: () => recordingKeys.byOutline(toValue(channelId), toValue(outlineId)),
    queryFn: ({ signal }) => listRecordings(toValue(channelId), toValue(outlineId), signal),
    enabled: () => toValue(active),
  })
  const episode = computed<Episode | null>(() => episodeQuery.data.value ?? null)
  const currentRecording = computed<Recording | null>(() => recordingsQuery.data.value?.find((r) => r.current) ?? null)
  const loading = computed(() => episodeQuery.isPending.value || recordingsQuery.isPending.value)
  const loadError = computed(() => {
    const error = episodeQuery.error.value ?? recordingsQuery.error.value
    return error ? `The episode settings couldn't be loaded. ${error.message}` : null
  })

  const form = reactive<EpisodeForm>(blankForm())
  /** once someone types an address name, the title no longer suggests one */
  const slugTyped = ref(false)
  const filled = ref(false)
  const errors = ref<Partial<Record<EpisodeField, string>>>({})
  const message = ref<string | null>(null)
  const publishing = ref(false)
  const unpublishing = ref(false)

  watch(
    () => [toValue(active), episodeQuery.data.value, recordingsQuery.data.value] as const,
    ([open, found, recordings]) => {
      if (!open || filled.value || found === undefined || recordings === undefined) return
      filled.value = true
      fill(found)
    },
    { immediate: true },
  )

  function fill(found: Episode | null): void {
    const doc = outline()
    const title = found?.title ?? doc?.title ?? ''
    Object.assign(form, {
      title,
      slug: found?.slug ?? suggestSlug(title),
      visibility: found?.visibility ?? 'public',
      when: found?.state === 'scheduled' ? 'later' : 'now',
      publishAt: found?.state === 'scheduled' ? new Date(found.publishAt) : null,
      description: found?.description ?? (doc ? toDescription(doc) : ''),
      video: found ? found.video.kind : currentRecording.value ? 'recording' : 'none',
      videoUrl: found?.video.kind === 'external' ? found.video.url : '',
    } satisfies EpisodeForm)
    slugTyped.value = found !== null
    errors.value = {}
    message.value = null
  }

  function setTitle(title: string): void {
    form.title = title
    if (!slugTyped.value) form.slug = suggestSlug(title)
  }

  function setSlug(slug: string): void {
    form.slug = slug
    slugTyped.value = true
  }

  /** Puts the generated description back, e.g. after the chapters changed. */
  function regenerateDescription(): void {
    const doc = outline()
    if (doc) form.description = toDescription(doc)
  }

  const channelSlug = computed(() => session.memberships?.find((m) => m.channelId === toValue(channelId))?.channelSlug ?? null)
  /** The page's full address as it will be, following the address name as it is typed. */
  const pageAddress = computed(() => (channelSlug.value ? `${location.origin}/episodes/${channelSlug.value}/${form.slug || '…'}` : null))

  async function publish(): Promise<void> {
    if (publishing.value) return
    errors.value = {}
    message.value = null
    const body = request()
    if (!body) return
    publishing.value = true
    try {
      await saveFirst()
      remember(await publishEpisode(toValue(channelId), toValue(outlineId), body))
    } catch (error) {
      refused(error, "The episode couldn't be published")
    } finally {
      publishing.value = false
    }
  }

  async function unpublish(): Promise<void> {
    if (unpublishing.value) return
    message.value = null
    unpublishing.value = true
    try {
      remember(await unpublishEpisode(toValue(channelId), toValue(outlineId)))
    } catch (error) {
      refused(error, "The episode couldn't be taken down")
    } finally {
      unpublishing.value = false
    }
  }

  /** The form as the contract takes it, or null with the reasons placed at their fields. */
  function request(): EpisodePublish | null {
    if (form.when === 'later' && !form.publishAt) {
      errors.value = { publishAt: 'Choose the date and time the episode appears.' }
      return null
    }
    if (form.video === 'recording' && !currentRecording.value) {
      message.value = 'The take has no recording yet: upload one when aligning, or choose a video address.'
      return null
    }
    const video: EpisodeVideoChoice =
      form.video === 'recording'
        ? { kind: 'recording', recordingId: currentRecording.value!.id }
        : form.video === 'external'
          ? { kind: 'external', url: form.videoUrl.trim() }
          : { kind: 'none' }
    const parsed = episodePublishSchema.safeParse({
      slug: form.slug.trim(),
      title: form.title,
      visibility: form.visibility,
      publishAt: form.when === 'later' ? form.publishAt!.toISOString() : undefined,
      description: form.description,
      video,
    })
    if (parsed.success) return parsed.data
    place(parsed.error.issues.map((i) => ({ path: i.path.map(String), message: i.message })))
    return null
  }

  function remember(saved: Episode): void {
    client.setQueryData(episodeKeys.byOutline(toValue(channelId), toValue(outlineId)), saved)
    void client.invalidateQueries({ queryKey: episodeKeys.all(toValue(channelId)) })
  }

  /** Shows why the server (or the save before it) refused; `failed` leads a failure that isn't the server's answer. */
  function refused(error: unknown, failed: string): void {
    if (!isApiError(error)) {
      message.value = `${failed}: ${(error as Error).message}`
      return
    }
    if (error.status === 409) {
      errors.value = { slug: error.message }
      return
    }
    if (error.status === 400 && Array.isArray(error.details)) {
      const issues = (error.details as { path?: unknown; message?: unknown }[]).flatMap((d) =>
        typeof d.path === 'string' && typeof d.message === 'string' ? [{ path: d.path.split('.').slice(1), message: d.message }] : [],
      )
      if (place(issues)) return
    }
    message.value = error.message
  }

  /** Shows each issue at its field (the first per field); anything without a field goes to the message. True when all were placed. */
  function place(issues: { path: string[]; message: string }[]): boolean {
    const placed: Partial<Record<EpisodeField, string>> = {}
    const loose: string[] = []
    for (const issue of issues) {
      const field = FIELD_OF[issue.path[0] ?? '']
      if (field) placed[field] ??= sentence(issue.message)
      else loose.push(sentence(issue.message))
    }
    errors.value = placed
    if (loose.length) message.value = loose[0]!
    return loose.length === 0 && issues.length > 0
  }

  return {
    episode,
    currentRecording,
    loading,
    loadError,
    form,
    errors,
    message,
    pageAddress,
    publishing,
    unpublishing,
    setTitle,
    setSlug,
    regenerateDescription,
    publish,
    unpublish,
  }
}

async function takeEpisodeOrNull(channelId: number, outlineId: number, signal: AbortSignal): Promise<Episode | null> {
  try {
    return await getTakeEpisode(channelId, outlineId, signal)
  } catch (error) {
    if (isApiError(error) && error.status === 404) return null
    throw error
  }
}

/** An address name from a title: lower-case letters and digits, words joined by single hyphens ("Four Fevers!" → "four-fevers"). */
function suggestSlug(title: string): string {
  const words = title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .split(/[^a-z0-9]+/)
    .filter(Boolean)
  let slug = ''
  for (const word of words) {
    const next = slug ? `${slug}-${word}` : word
    if (next.length > SLUG_MAX) break
    slug = next
  }
  return slug
}

function blankForm(): EpisodeForm {
  return { title: '', slug: '', visibility: 'public', when: 'now', publishAt: null, description: '', video: 'none', videoUrl: '' }
}

/** The contract's messages start in lower case to read inside a longer one; alone at a field they start a sentence. */
function sentence(text: string): string {
  const capital = text.charAt(0).toUpperCase() + text.slice(1)
  return /[.!?]$/.test(capital) ? capital : `${capital}.`
}
