/** One recognised or captioned word with its time in the recording. */
export interface TimedWord {
  word: string
  startMs: number
  endMs: number
  /** 0..1 when the source says how sure it is (a recogniser does, a caption file doesn't) */
  confidence?: number
}
