/** Aligning a take's script lines to the words heard in its recording. */
export { alignLines, type Alignment } from './align'
export { spokenWords } from './words'
export type { TimedWord } from './types'
