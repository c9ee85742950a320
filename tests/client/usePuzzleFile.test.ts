import { afterEach, describe, expect, it, vi } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { defineComponent, h } from 'vue'
import type { PuzzleFile } from '@shared/schemas/puzzle'
import PuzzleFilePanel from '@/components/PuzzleFilePanel.vue'
import { usePuzzleFile } from '@/composables/usePuzzleFile'
import classic from '../fixtures/classic-puzzles.json'
import { renderComponent } from './render'

// Project Euler problem 96, grid 01 (source named in tests/fixtures/classic-puzzles.json).
const PE01 = classic.puzzles.find((p) => p.id === 'PE01')!.givens

/** The file panel wired to the composable as the Puzzle screen does it; `loaded` collects what reached the form. */
function renderFiles(current: PuzzleFile = { title: 'Morning climb', givens: PE01, thermometers: [] }, canOpen = true) {
  const loaded: PuzzleFile[] = []
  const Harness = defineComponent({
    setup() {
      const files = usePuzzleFile({ current: () => current, load: (file) => loaded.push(file) })
      return () => h(PuzzleFilePanel, { canOpen, problem: files.problem.value, notice: files.notice.value, onOpen: files.open, onDownload: files.download })
    },
  })
  const { container } = renderComponent(Harness)
  const user = userEvent.setup()
  /** The file chooser opens from the "Open a file…" button; the browser hands the choice to its hidden input. */
  async function choose(name: string, content: unknown) {
    await user.click(screen.getByRole('button', { name: 'Open a file…' }))
    const text = typeof content === 'string' ? content : JSON.stringify(content)
    await user.upload(container.querySelector<HTMLInputElement>('input[type="file"]')!, new File([text], name, { type: 'application/json' }))
    // File.text() answers on a later turn; every message names the file it is about.
    await vi.waitFor(() => screen.getByText((text) => text.includes(name)))
  }
  return { user, loaded, choose }
}

/** What saveFile hands the browser: each download's file name and text. */
function catchDownloads() {
  const blobs: Blob[] = []
  const names: string[] = []
  vi.spyOn(URL, 'createObjectURL').mockImplementation((blob) => {
    blobs.push(blob as Blob)
    return 'blob:puzzle'
  })
  vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => {})
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    names.push(this.download)
  })
  return { names, texts: () => Promise.all(blobs.map((b) => b.text())) }
}

describe('usePuzzleFile', () => {
  afterEach(() => {
    vi.restoreAllMocks()
  })

  // The format is docs/puzzle-format.md: title 1-200 characters, optional author, 81 givens, thermometers of cell names.
  it('should read a puzzle file into the form and say where it came from', async () => {
    const { loaded, choose } = renderFiles()
    await choose('lantern.puzzle.json', { title: '  Lantern Steps ', author: 'Oona Fairweather', givens: PE01, thermometers: [['R1C1', 'r2c2']] })

    expect(loaded).toEqual([{ title: 'Lantern Steps', author: 'Oona Fairweather', givens: PE01, thermometers: [['R1C1', 'r2c2']] }])
    expect(screen.getByText('Loaded “Lantern Steps” from lantern.puzzle.json. Save to keep it.')).toBeVisible()
  })

  it('should read a file without thermometers as a classic puzzle', async () => {
    const { loaded, choose } = renderFiles()
    await choose('classic.json', { title: 'Grid 01', givens: PE01 })
    expect(loaded).toEqual([{ title: 'Grid 01', givens: PE01, thermometers: [] }])
  })

  it.each([
    ['notes.json', 'shopping list', "notes.json is not a Gridcue puzzle file (it isn't JSON)."],
    ['a.json', { givens: PE01 }, /^a\.json is not a Gridcue puzzle file: title — /],
    ['b.json', { title: 'Short', givens: PE01.slice(1) }, "b.json: the givens must be 81 characters, each 1-9 or '.'."],
    ['c.json', { title: 'Letters', givens: PE01.replace('3', 'x') }, "c.json: the givens must be 81 characters, each 1-9 or '.'."],
    ['d.json', { title: 'Off the grid', givens: PE01, thermometers: [['r1c1', 'r10c1']] }, 'd.json: "r10c1" is not a cell name such as r3c4.'],
    ['e.json', { title: 'Stub', givens: PE01, thermometers: [['r1c1', 'r1c2'], ['r5c5']] }, 'e.json: thermometer 2 has 1 cell; a thermometer has 2 to 9.'],
    ['f.json', { title: 'Loose', givens: PE01, thermometers: 'r1c1 r1c2' }, /^f\.json is not a Gridcue puzzle file: thermometers — /],
  ])('should refuse %s with a message that says what is wrong, and load nothing', async (name, content, message) => {
    const { loaded, choose } = renderFiles()
    await choose(name, content)

    expect(screen.getByText(message)).toBeVisible()
    expect(loaded).toEqual([])
  })

  it('should clear an earlier problem once a good file is read', async () => {
    const { choose } = renderFiles()
    await choose('bad.json', '{')
    await choose('good.json', { title: 'Grid 01', givens: PE01 })

    expect(screen.queryByText(/bad\.json/)).toBeNull()
    expect(screen.getByText(/^Loaded “Grid 01”/)).toBeVisible()
  })

  it('should download the puzzle as indented JSON, named after its title', async () => {
    const downloads = catchDownloads()
    const puzzle = { title: "Café à l'heure", author: 'Rosa Ilves', givens: PE01, thermometers: [['r1c1', 'r2c2']] }
    const { user } = renderFiles(puzzle)

    await user.click(screen.getByRole('button', { name: 'Download' }))

    expect(downloads.names).toEqual(['cafe-a-l-heure.puzzle.json'])
    const [text] = await downloads.texts()
    expect(text).toBe(`${JSON.stringify(puzzle, null, 2)}\n`)
  })

  it('should offer only the download to someone who cannot edit the puzzle', () => {
    renderFiles(undefined, false)
    expect(screen.queryByRole('button', { name: 'Open a file…' })).toBeNull()
    expect(screen.getByRole('button', { name: 'Download' })).toBeEnabled()
  })
})
