/**
 * Script and timing: from an engine solve path to what a presenter says, when, and every export.
 */
export { buildOutline } from './build'
export { timeline, TIMING, type Timeline, type TimedLine } from './timing'
export { fitToTarget, type FitResult, type FitSuggestion } from './fit'
export {
  editLineText,
  revertLineText,
  foldLines,
  splitLine,
  hideLine,
  showLine,
  startChapterAt,
  renameChapter,
  removeChapter,
  setPace,
  refreshNarration,
  setNames,
  setTarget,
  alignLine,
  applyEdit,
} from './edits'
export { publishedChapters } from './chapters'
export { toWebVttChapters, toWebVttCaptions } from './webvtt'
export { toSrt } from './srt'
export { toDescription } from './description'
export { toOutlineJson, fromOutlineJson } from './json'
export { cueSheetRows, type CueSheetRow } from './cue-sheet'
export { formatClock } from './timecode'
export type { Outline, OutlineLine, Chapter, NamingStyle, OutlineEdit } from '../schemas/outline'
export { exportFileName } from './file-names'
export { difficultyReport, WHAT_IF_SHARE_MAX, DRY_SPELL_MAX_MS } from './difficulty'
