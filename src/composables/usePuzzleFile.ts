import { ref } from 'vue'
import type { z } from 'zod'
import { puzzleFileSchema } from '@shared/schemas/puzzle'
import type { PuzzleFile } from '@shared/schemas/puzzle'
import { saveFile } from './fileDownload'

export interface PuzzleFileOptions {
  /** The puzzle as it stands, to download. */
  current: () => PuzzleFile
  /** Takes a puzzle read from a file into the screen. */
  load: (file: PuzzleFile) => void
}

/** Opening and downloading puzzle files (docs/puzzle-format.md), read through the shared puzzle-file schema. */
export function usePuzzleFile({ current, load }: PuzzleFileOptions) {
  const problem = ref<string | null>(null)
  const notice = ref<string | null>(null)

  async function open(file: File): Promise<void> {
    problem.value = null
    notice.value = null
    const read = readPuzzleFile(await file.text(), file.name)
    if ('problem' in read) {
      problem.value = read.problem
      return
    }
    load(read.puzzle)
    notice.value = `Loaded “${read.puzzle.title}” from ${file.name}. Save to keep it.`
  }

  function download(): void {
    const puzzle = current()
    saveFile(`${slug(puzzle.title)}.puzzle.json`, `${JSON.stringify(puzzle, null, 2)}\n`, 'application/json')
  }

  return { problem, notice, open, download }
}

function readPuzzleFile(text: string, fileName: string): { puzzle: PuzzleFile } | { problem: string } {
  let data: unknown
  try {
    data = JSON.parse(text)
  } catch {
    return { problem: `${fileName} is not a Gridcue puzzle file (it isn't JSON).` }
  }
  const parsed = puzzleFileSchema.safeParse(data, { reportInput: true })
  return parsed.success ? { puzzle: parsed.data } : { problem: describeIssue(parsed.error.issues[0], fileName) }
}

/** The schema's first complaint in the presenter's words: givens, cell names and thermometer lengths get a line of their own. */
function describeIssue(issue: z.core.$ZodIssue, fileName: string): string {
  const [field, thermometer, cell] = issue.path
  if (field === 'givens' && issue.code === 'invalid_format') return `${fileName}: the givens must be 81 characters, each 1-9 or '.'.`
  if (field === 'thermometers' && cell !== undefined && issue.code === 'invalid_format') return `${fileName}: "${String(issue.input)}" is not a cell name such as r3c4.`
  if (field === 'thermometers' && typeof thermometer === 'number' && cell === undefined && Array.isArray(issue.input)) {
    const count = issue.input.length
    return `${fileName}: thermometer ${thermometer + 1} has ${count} ${count === 1 ? 'cell' : 'cells'}; a thermometer has 2 to 9.`
  }
  return `${fileName} is not a Gridcue puzzle file: ${issue.path.join('.') || 'file'} — ${issue.message}.`
}

function slug(title: string): string {
  return (
    title
      .toLowerCase()
      .normalize('NFKD')
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'puzzle'
  )
}
