import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { render, screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { TECHNIQUES } from '@shared/engine'
import { cellName, cellSpokenName } from '@shared/grid'
import type { EpisodePage } from '@shared/schemas/episode'
import EpisodeScreen from '@/episode/components/EpisodeScreen.vue'
import { solveAlongKey } from '@/episode/composables/useSolveAlong'
import { settle } from '../render'
import { episodePageFor } from './page-fixture'

// GT07's path: line 1 is the intro, line 2 places a 3 at r1c6 (its only place in box 2), then thermometer steps
const page = episodePageFor('GT07')
const FIRST_PLACEMENT = page.lines.findIndex((l) => l.steps.some((s) => page.steps[s]!.placements.length > 0))
const firstPlaced = page.steps[page.lines[FIRST_PLACEMENT]!.steps[0]!]!.placements[0]!

function renderScreen(data: EpisodePage = page) {
  return render(EpisodeScreen, { props: { page: data } })
}

const items = () => within(screen.getByRole('region', { name: 'Steps' })).queryAllByRole('listitem')
const cell = (c: number) => screen.getByRole('gridcell', { name: new RegExp(`^${cellSpokenName(c)},`) })
const video = () => document.querySelector('video')!

/** The media element reports a time, as a playing video does a few times a second. */
async function playTo(ms: number) {
  video().currentTime = ms / 1000
  video().dispatchEvent(new Event('timeupdate'))
  await settle()
}

/** Cells showing a digit that is neither a given nor placed by the first `k` steps: a digit from later in the solve. */
function laterDigitsOnGrid(k: number): string[] {
  const allowed = new Set<number>()
  for (let c = 0; c < 81; c++) if (page.puzzle.givens[c] !== '.') allowed.add(c)
  for (const step of page.steps.slice(0, k)) for (const p of step.placements) allowed.add(p.cell)
  return screen
    .getAllByRole('gridcell')
    .map((el) => el.getAttribute('aria-label')!)
    .filter((name, c) => !allowed.has(c) && /^row \d, column \d, \d/.test(name))
}

beforeEach(() => {
  localStorage.clear()
  window.history.replaceState(null, '', '/episodes/quince-street/thermo-night-7')
})
afterEach(() => localStorage.clear())

describe('EpisodeScreen: following playback', () => {
  it('should mark the playing line and show its digit on the grid once playback reaches it', async () => {
    renderScreen()
    const line = page.lines[FIRST_PLACEMENT]!
    await playTo(line.startMs - 100)
    expect(cell(firstPlaced.cell)).toHaveAccessibleName(`${cellSpokenName(firstPlaced.cell)}, empty`)
    expect(items()[FIRST_PLACEMENT]).not.toHaveAttribute('aria-current')

    await playTo(line.startMs + 100)
    expect(items()[FIRST_PLACEMENT]).toHaveAttribute('aria-current', 'step')
    expect(items().filter((li) => li.hasAttribute('aria-current'))).toHaveLength(1)
    expect(cell(firstPlaced.cell)).toHaveAccessibleName(new RegExp(`^${cellSpokenName(firstPlaced.cell)}, ${firstPlaced.digit}, placed now`))
  })

  it('should seek the video to a step\'s start when the step is picked, and follow it at once', async () => {
    const user = userEvent.setup()
    renderScreen()
    Object.defineProperty(video(), 'readyState', { value: 1 }) // HAVE_METADATA: the video knows its length
    const target = page.lines[5]!
    await user.click(within(items()[5]!).getByRole('button'))
    expect(video().currentTime).toBe(target.startMs / 1000)
    expect(items()[5]).toHaveAttribute('aria-current', 'step')
  })

  it('should seek to a chapter\'s start from the chapter list', async () => {
    const user = userEvent.setup()
    renderScreen()
    Object.defineProperty(video(), 'readyState', { value: 1 }) // HAVE_METADATA: the video knows its length
    const chapter = page.chapters[2]!
    await user.click(within(screen.getByRole('region', { name: 'Chapters' })).getByRole('button', { name: new RegExp(chapter.title) }))
    expect(video().currentTime).toBe(chapter.startMs / 1000)
  })

  it('should list each step with its time, its line and the digits it places', () => {
    renderScreen()
    expect(items()).toHaveLength(page.lines.length)
    const item = items()[FIRST_PLACEMENT]!
    expect(item).toHaveAttribute('id', `step-${FIRST_PLACEMENT + 1}`)
    expect(item).toHaveTextContent(page.lines[FIRST_PLACEMENT]!.text)
    expect(item).toHaveTextContent(`${cellName(firstPlaced.cell)} = ${firstPlaced.digit}`)
    expect(screen.getByText(/^Times are estimated from the script/)).toBeInTheDocument()
  })

  it('should say the times are estimated only when they are', () => {
    renderScreen({ ...page, timing: 'aligned' })
    expect(screen.queryByText(/^Times are estimated/)).not.toBeInTheDocument()
  })
})

describe('EpisodeScreen: solve-along', () => {
  it('should leave every step past the viewer\'s position out of the page, and nudge where, what kind, then the step', async () => {
    const user = userEvent.setup()
    renderScreen()
    await playTo(page.durationMs) // the video has played to the end: solve-along must not care
    await user.click(screen.getByRole('button', { name: 'Solve along (no spoilers)' }))
    expect(screen.getByRole('button', { name: 'Solve along (no spoilers)' })).toHaveAttribute('aria-pressed', 'true')

    // only the intro is reached: no later line is rendered at all, and the grid holds the givens only
    expect(items()).toHaveLength(FIRST_PLACEMENT)
    for (const line of page.lines.slice(FIRST_PLACEMENT)) expect(screen.queryByText(line.text)).not.toBeInTheDocument()
    expect(laterDigitsOnGrid(0)).toEqual([])

    // 1: where to look (GT07's first step is the only place for a 3 in box 2), tinted on the grid, no digit
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    expect(screen.getByText('Look at box 2.')).toBeInTheDocument()
    expect(screen.queryByText('What kind of step')).not.toBeInTheDocument()
    expect(cell(firstPlaced.cell)).toHaveAccessibleName(`${cellSpokenName(firstPlaced.cell)}, empty, reason`)
    expect(laterDigitsOnGrid(0)).toEqual([])

    // 2: what kind of deduction, in plain words
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    expect(screen.getByText(TECHNIQUES['hidden-single'].plainName)).toBeInTheDocument()
    expect(screen.queryByText(page.lines[FIRST_PLACEMENT]!.text)).not.toBeInTheDocument()
    expect(laterDigitsOnGrid(0)).toEqual([])

    // 3: the digit and the reason; the grid shows that digit and nothing later
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    expect(screen.getByText(`${cellName(firstPlaced.cell)} = ${firstPlaced.digit}`)).toBeInTheDocument()
    expect(screen.getByText(page.lines[FIRST_PLACEMENT]!.text)).toBeInTheDocument()
    expect(cell(firstPlaced.cell)).toHaveAccessibleName(new RegExp(`^${cellSpokenName(firstPlaced.cell)}, ${firstPlaced.digit}`))
    expect(laterDigitsOnGrid(1)).toEqual([])
    expect(screen.queryByRole('button', { name: /^Nudge/ })).not.toBeInTheDocument()

    // next: the step joins the list, and the next one starts hidden again
    await user.click(screen.getByRole('button', { name: 'Next step' }))
    expect(items()).toHaveLength(FIRST_PLACEMENT + 1)
    expect(screen.queryByText(page.lines[FIRST_PLACEMENT + 1]!.text)).not.toBeInTheDocument()
    expect(screen.getByRole('button', { name: /^Nudge \(1 of 3\)/ })).toBeInTheDocument()
  })

  it('should keep the viewer\'s position in this browser only, per episode, and start over on request', async () => {
    const user = userEvent.setup()
    const first = renderScreen()
    await user.click(screen.getByRole('button', { name: 'Solve along (no spoilers)' }))
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    await user.click(screen.getByRole('button', { name: 'Next step' }))
    await user.click(screen.getByRole('button', { name: /^Nudge/ }))
    first.unmount()

    expect(JSON.parse(localStorage.getItem(solveAlongKey('quince-street', 'thermo-night-7'))!)).toEqual({ on: true, line: FIRST_PLACEMENT + 1, level: 1 })
    renderScreen()
    expect(items()).toHaveLength(FIRST_PLACEMENT + 1)
    expect(screen.getByRole('button', { name: /^Nudge \(2 of 3\)/ })).toBeInTheDocument()

    await user.click(screen.getByRole('button', { name: 'Start over' }))
    expect(items()).toHaveLength(FIRST_PLACEMENT)
    expect(laterDigitsOnGrid(0)).toEqual([])
  })

  it('should stop the video at the start of the last line the viewer has reached: playing on would show what comes next', async () => {
    const user = userEvent.setup()
    renderScreen()
    Object.defineProperty(video(), 'readyState', { value: 1 }) // HAVE_METADATA: the video knows its length
    await playTo(page.lines[20]!.startMs)
    const pause = vi.spyOn(video(), 'pause')
    await user.click(screen.getByRole('button', { name: 'Solve along (no spoilers)' }))
    expect(pause).toHaveBeenCalledTimes(1)
    expect(video().currentTime).toBe(page.lines[FIRST_PLACEMENT - 1]!.startMs / 1000)

    for (const name of [/^Nudge/, /^Nudge/, /^Nudge/, 'Next step']) await user.click(screen.getByRole('button', { name }))
    expect(video().currentTime).toBe(page.lines[FIRST_PLACEMENT]!.startMs / 1000)

    // once off, the page follows the video again from there
    await user.click(screen.getByRole('button', { name: 'Solve along (no spoilers)' }))
    expect(items()[FIRST_PLACEMENT]).toHaveAttribute('aria-current', 'step')
  })

  it('should ignore a deep link into the middle of the solve while the viewer is solving along', async () => {
    localStorage.setItem(solveAlongKey('quince-street', 'thermo-night-7'), JSON.stringify({ on: true, line: FIRST_PLACEMENT, level: 0 }))
    window.history.replaceState(null, '', '/episodes/quince-street/thermo-night-7?t=300#step-30')
    renderScreen()
    await settle()
    expect(items()).toHaveLength(FIRST_PLACEMENT)
    expect(screen.queryByText(page.lines[29]!.text)).not.toBeInTheDocument()
    expect(laterDigitsOnGrid(0)).toEqual([])
  })

  it('should follow playback again once solve-along is off', async () => {
    const user = userEvent.setup()
    renderScreen()
    await user.click(screen.getByRole('button', { name: 'Solve along (no spoilers)' }))
    await playTo(page.lines[10]!.startMs)
    expect(items().some((li) => li.hasAttribute('aria-current'))).toBe(false)
    await user.click(screen.getByRole('button', { name: 'Solve along (no spoilers)' }))
    expect(items()).toHaveLength(page.lines.length)
    expect(items()[10]).toHaveAttribute('aria-current', 'step')
  })
})

describe('EpisodeScreen: deep links', () => {
  it('should start at ?t= (here 1m30s): the line playing then is the current one', async () => {
    window.history.replaceState(null, '', '/episodes/quince-street/thermo-night-7?t=1m30s')
    renderScreen()
    await settle()
    const playing = page.lines.filter((l) => l.startMs <= 90_000).length - 1
    expect(items()[playing]).toHaveAttribute('aria-current', 'step')
  })

  it('should go to #step-n: the item is current and its button has the focus', async () => {
    window.history.replaceState(null, '', '/episodes/quince-street/thermo-night-7#step-12')
    renderScreen()
    await settle()
    expect(items()[11]).toHaveAttribute('aria-current', 'step')
    expect(within(items()[11]!).getByRole('button')).toHaveFocus()
  })
})

describe('EpisodeScreen: the page around the grid', () => {
  it('should credit the setter, link the puzzle and state the rules', () => {
    renderScreen()
    expect(screen.getByRole('heading', { level: 1, name: page.episode.title })).toBeInTheDocument()
    expect(screen.getByText('Wren Alder')).toBeInTheDocument()
    expect(screen.getByRole('link', { name: 'Try the puzzle yourself' })).toHaveAttribute('href', 'https://puzzles.example/thermo-7')
    expect(screen.getByText(page.puzzle.rules)).toBeInTheDocument()
  })

  it('should attach the captions to the video, and offer a plain link for a video elsewhere', () => {
    const { unmount } = renderScreen()
    const track = video().querySelector('track')!
    expect(track).toHaveAttribute('kind', 'captions')
    expect(track).toHaveAttribute('src', page.captionsUrl)
    unmount()
    renderScreen({ ...page, player: { kind: 'link', url: 'https://videos.example/watch/7' }, captionsUrl: undefined })
    expect(screen.getByRole('link', { name: 'Watch the video' })).toHaveAttribute('href', 'https://videos.example/watch/7')
    expect(document.querySelector('video')).toBeNull()
  })
})
