/**
 * Query keys for the studio's server data (@tanstack/vue-query), in one place so a mutation can invalidate
 * exactly what it changed. Every key starts with the channel, so leaving a channel can drop its cache at once.
 */
export const puzzleKeys = {
  all: (channelId: number) => ['channels', channelId, 'puzzles'] as const,
  detail: (channelId: number, puzzleId: number) => ['channels', channelId, 'puzzles', puzzleId] as const,
}

export const outlineKeys = {
  byPuzzle: (channelId: number, puzzleId: number) => ['channels', channelId, 'puzzles', puzzleId, 'outlines'] as const,
  detail: (channelId: number, outlineId: number) => ['channels', channelId, 'outlines', outlineId] as const,
}

/** A recording's waveform and runs sit under the take's list; a change to the list refreshes the list alone (`exact`), as they don't change with it. */
export const recordingKeys = {
  byOutline: (channelId: number, outlineId: number) => ['channels', channelId, 'outlines', outlineId, 'recordings'] as const,
  mediaLink: (channelId: number, outlineId: number, recordingId: number) =>
    ['channels', channelId, 'outlines', outlineId, 'recordings', recordingId, 'media-link'] as const,
  peaks: (channelId: number, outlineId: number, recordingId: number) =>
    ['channels', channelId, 'outlines', outlineId, 'recordings', recordingId, 'peaks'] as const,
  runs: (channelId: number, outlineId: number, recordingId: number) =>
    ['channels', channelId, 'outlines', outlineId, 'recordings', recordingId, 'alignments'] as const,
  run: (channelId: number, outlineId: number, recordingId: number, runId: number) =>
    ['channels', channelId, 'outlines', outlineId, 'recordings', recordingId, 'alignments', runId] as const,
}

/** The channel's episode list, and each take's own episode (null when never published). */
export const episodeKeys = {
  all: (channelId: number) => ['channels', channelId, 'episodes'] as const,
  byOutline: (channelId: number, outlineId: number) => ['channels', channelId, 'outlines', outlineId, 'episode'] as const,
}
