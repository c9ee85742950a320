import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import classic from '../fixtures/classic-puzzles.json'
import { useBrowserSuite } from '../helpers/browser'

// Project Euler problem 96, grid 01 (source noted in tests/fixtures/classic-puzzles.json): unique on its own,
// so adding a thermometer that agrees with its solution keeps it unique.
const PE01 = classic.puzzles.find((p) => p.id === 'PE01')!

/** Three king-adjacent empty cells whose solution digits rise: a thermometer the solution satisfies. */
function risingPath(givens: string, solution: string): number[] {
  const empty = (c: number) => givens[c] === '.'
  const near = (a: number, b: number) => a !== b && Math.abs(Math.floor(a / 9) - Math.floor(b / 9)) <= 1 && Math.abs((a % 9) - (b % 9)) <= 1
  for (let a = 0; a < 81; a++)
    for (let b = 0; b < 81; b++)
      for (let c = 0; c < 81; c++)
        if (empty(a) && empty(b) && empty(c) && near(a, b) && near(b, c) && a !== c && solution[a]! < solution[b]! && solution[b]! < solution[c]!)
          return [a, b, c]
  throw new Error('no rising path')
}

const cellName = (c: number) => `r${Math.floor(c / 9) + 1}c${(c % 9) + 1}`
/** How the grid names a cell for screen readers. */
const cellSpokenName = (c: number) => `row ${Math.floor(c / 9) + 1}, column ${(c % 9) + 1}`

const suite = useBrowserSuite()

async function centreOf(page: Page, cell: number) {
  const box = await page.getByRole('gridcell', { name: new RegExp(`^${cellSpokenName(cell)},`) }).first().boundingBox()
  if (!box) throw new Error(`cell ${cellName(cell)} is not on screen`)
  return { x: box.x + box.width / 2, y: box.y + box.height / 2 }
}

describe('presenter: from an empty puzzle to an edited, saved outline (Chromium)', () => {
  it('should type givens, drag a thermometer, find the path, step with the keyboard and keep an edited line across a reload', async () => {
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } })
    await page.goto(suite.url)
    await page.getByLabel('E-mail').fill('presenter@gridcue.example')
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByText('Marigold Logic').first().click()
    await page.getByRole('link', { name: 'New puzzle' }).click()

    await page.getByLabel('Title').fill('Lantern Steps')
    await page.getByLabel('Setter').fill('Oona Fairweather')

    // givens typed on the keyboard: select a cell with a click, type its digit
    for (let cell = 0; cell < 81; cell++) {
      const digit = PE01.givens[cell]!
      if (digit === '.') continue
      const { x, y } = await centreOf(page, cell)
      await page.mouse.click(x, y)
      await page.keyboard.press(digit)
    }
    await expect.poll(() => page.getByLabel('Givens as text').inputValue()).toBe(PE01.givens)

    // a thermometer dragged from its bulb through two touching cells
    const path = risingPath(PE01.givens, PE01.solution)
    const points = await Promise.all(path.map((c) => centreOf(page, c)))
    await page.mouse.move(points[0]!.x, points[0]!.y)
    await page.mouse.down()
    for (const p of points.slice(1)) await page.mouse.move(p.x, p.y, { steps: 4 })
    await page.mouse.up()
    await page.getByText(path.map(cellName).join(' → ')).waitFor()

    await page.getByText('Unique solution').first().waitFor()
    await page.getByRole('button', { name: 'Save' }).click()
    await page.getByText(/All changes saved/).waitFor()

    await page.getByRole('button', { name: 'Find the path' }).click()
    await page.waitForURL(/\/outlines\/\d+/)
    await page.getByRole('group', { name: 'Replay' }).waitFor()

    // step through with the keyboard; the address keeps the step
    await page.locator('body').click({ position: { x: 5, y: 5 } })
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowRight')
    await page.waitForURL(/[?&]step=3\b/)
    await page.getByText(/Step 3 of \d+/).waitFor()
    await page.keyboard.press('End')
    await page.waitForURL((url) => Number(url.searchParams.get('step')) > 10)

    // edit the first script line after the intro and wait for the autosave
    const line = page.getByRole('textbox', { name: /^Line 2 \(/ })
    await line.fill('Let me point at the first thing I notice: the thermometer we just drew.')
    await line.blur()
    await page.getByRole('status').getByText('Saved', { exact: true }).waitFor({ timeout: 20_000 })

    await page.reload()
    await page.getByRole('group', { name: 'Replay' }).waitFor()
    await expect.poll(() => page.getByRole('textbox', { name: /^Line 2 \(/ }).inputValue()).toBe(
      'Let me point at the first thing I notice: the thermometer we just drew.',
    )
    expect(new URL(page.url()).searchParams.get('step')).not.toBeNull()

    // and the server holds it, not only this browser
    const stored = await suite.db('outlines').orderBy('id', 'desc').first()
    expect(JSON.stringify(stored!.script)).toContain('the thermometer we just drew')
    await page.close()
  })
})
