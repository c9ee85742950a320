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
