import { computed, reactive, ref, toValue, watch } from 'vue'
import type { MaybeRefOrGetter } from 'vue'
import { useMutation, useQuery, useQueryClient } from '@tanstack/vue-query'
import type { AlignmentMethod, AlignmentRun, Recording } from '@shared/schemas/recording'
import type { Outline, OutlineEdit } from '@shared/script'
import { isApiError } from '@/api/http'
import { cancelAlignmentRun, getAlignmentRun, listAlignmentRuns, startAudioAlignment, startCaptionAlignment } from '@/api/recordings'
import { recordingKeys } from '@/api/queryKeys'

/** A run's progress is asked for this often while it is queued or running. */
const RUN_POLL_MS = 1000

type ProposalState = 'open' | 'accepted' | 'rejected'

export interface ProposalRow {
  lineId: number
  /** 1-based position in the script */
  number: number
  text: string
  /** The proposed start with the person's nudges. */
  startMs: number
  confidence: number
  state: ProposalState
}

export interface AlignSuggestionsOptions {
  channelId: MaybeRefOrGetter<number>
  outlineId: MaybeRefOrGetter<number>
  recording: MaybeRefOrGetter<Recording | null>
  outline: MaybeRefOrGetter<Outline | null>
  /** The outline editor's applyAll: accepting is an ordinary, undoable `alignLine` edit. */
  applyAll: (edits: readonly OutlineEdit[]) => boolean
}

/**
 * Suggested starts from a caption file or from the recording itself: the latest run of the current recording,
 * followed while it works, and the person's verdict on each proposal. A proposal counts as accepted while its
 * line starts where it says, so undoing an acceptance opens it again.
 */
export function useAlignSuggestions({ channelId, outlineId, recording, outline, applyAll }: AlignSuggestionsOptions) {
  const client = useQueryClient()
  const recordingId = () => toValue(recording)?.id ?? 0
  const runKey = (runId: number) => recordingKeys.run(toValue(channelId), toValue(outlineId), recordingId(), runId)

  const runs = useQuery({
    queryKey: () => recordingKeys.runs(toValue(channelId), toValue(outlineId), recordingId()),
    queryFn: ({ signal }) => listAlignmentRuns(toValue(channelId), toValue(outlineId), recordingId(), signal),
    enabled: () => toValue(recording) !== null,
  })
  /** A run started here, shown even before the list knows it. */
  const startedRunId = ref<number | null>(null)
  watch(recordingId, () => (startedRunId.value = null))
  const runId = computed(() => startedRunId.value ?? runs.data.value?.[0]?.id ?? null)

  const runQuery = useQuery({
    queryKey: () => runKey(runId.value ?? 0),
    queryFn: ({ signal }) => getAlignmentRun(toValue(channelId), toValue(outlineId), recordingId(), runId.value!, signal),
    enabled: () => runId.value !== null,
    initialData: () => runs.data.value?.find((r) => r.id === runId.value),
    refetchInterval: (query) => (isActive(query.state.data) ? RUN_POLL_MS : false),
  })
  const run = computed<AlignmentRun | null>(() => (runId.value === null ? null : (runQuery.data.value ?? null)))
  const active = computed(() => isActive(run.value))

  const start = useMutation({
    mutationFn: ({ method, file }: { method: AlignmentMethod; file?: File }) =>
      method === 'captions' && file
        ? startCaptionAlignment(toValue(channelId), toValue(outlineId), recordingId(), file)
        : startAudioAlignment(toValue(channelId), toValue(outlineId), recordingId()),
    onSuccess: (started) => {
      client.setQueryData(runKey(started.id), started)
      startedRunId.value = started.id
    },
  })
  const cancel = useMutation({
    mutationFn: () => cancelAlignmentRun(toValue(channelId), toValue(outlineId), recordingId(), runId.value!),
    onSuccess: (stopped) => client.setQueryData(runKey(stopped.id), stopped),
  })
  const error = computed(() => {
    const e = start.error.value ?? cancel.error.value ?? runQuery.error.value
    if (!e) return null
    return isApiError(e) ? e.message : 'Something went wrong; try again.'
  })

  /** Per run: nudges the person gave each proposal, and the ones they turned down. */
  const offsets = reactive(new Map<number, number>())
  const rejected = reactive(new Set<number>())
  watch(runId, () => {
    offsets.clear()
    rejected.clear()
  })

  const rows = computed<ProposalRow[]>(() => {
    const doc = toValue(outline)
    const done = run.value?.state === 'done' ? run.value : null
    if (!doc || !done) return []
    const lines = new Map(doc.lines.map((l, i) => [l.id, { line: l, number: i + 1 }]))
    return done.proposals.flatMap((p) => {
      const entry = lines.get(p.lineId)
      if (!entry) return []
      const startMs = Math.max(0, p.startMs + (offsets.get(p.lineId) ?? 0))
      const state: ProposalState = entry.line.alignedStartMs === startMs ? 'accepted' : rejected.has(p.lineId) ? 'rejected' : 'open'
      return [{ lineId: p.lineId, number: entry.number, text: entry.line.text, startMs, confidence: p.confidence, state }]
    })
  })

  /** The lines the run could not place, named for people. */
  const unplaced = computed(() => {
    const doc = toValue(outline)
    const done = run.value?.state === 'done' ? run.value : null
    if (!doc || !done) return []
    return done.unplaced.flatMap((lineId) => {
      const at = doc.lines.findIndex((l) => l.id === lineId)
      return at < 0 ? [] : [{ lineId, number: at + 1, text: doc.lines[at].text }]
    })
  })

  function accept(lineId: number): boolean {
    const row = rows.value.find((r) => r.lineId === lineId)
    if (!row) return false
    rejected.delete(lineId)
    return applyAll([{ op: 'alignLine', lineId, startMs: row.startMs }])
  }

  function reject(lineId: number): void {
    rejected.add(lineId)
  }

  function adjust(lineId: number, deltaMs: number): void {
    offsets.set(lineId, (offsets.get(lineId) ?? 0) + deltaMs)
    rejected.delete(lineId)
  }

  /** Accepts, as one undoable step, every open proposal at or above `percent` confidence; returns how many. */
  function acceptAbove(percent: number): number {
    const chosen = rows.value.filter((r) => r.state === 'open' && r.confidence * 100 >= percent)
    if (chosen.length === 0) return 0
    return applyAll(chosen.map((r) => ({ op: 'alignLine', lineId: r.lineId, startMs: r.startMs }))) ? chosen.length : 0
  }

  return {
    run, active, rows, unplaced, error,
    starting: start.isPending, cancelling: cancel.isPending,
    startFromAudio: () => start.mutate({ method: 'audio' }),
    startFromCaptions: (file: File) => start.mutate({ method: 'captions', file }),
    cancel: () => cancel.mutate(),
    accept, reject, adjust, acceptAbove,
  }
}

function isActive(run: AlignmentRun | null | undefined): boolean {
  return run?.state === 'queued' || run?.state === 'running'
}
