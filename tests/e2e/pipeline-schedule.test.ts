import { describe, expect, it } from 'vitest'
import { issueToken } from '../../server/auth/tokens'
import { DEMO_PASSWORD, DEMO_USERS } from '../../seeds/01_demo_channel'
import { useBrowserSuite } from '../helpers/browser'
import { testConfig } from '../helpers/db'
import { draftOf } from '../helpers/studio'

const suite = useBrowserSuite()
const owner = DEMO_USERS.find((u) => u.role === 'owner')!

/** A puzzle and a take made through the API as the owner, so the board has a card to plan. */
async function takeToPlan(): Promise<{ channelId: number; puzzleTitle: string }> {
  const user = (await suite.db('users').where({ email: owner.email }).first())!
  const channelId = (await suite.db('channels').where({ slug: 'marigold-logic' }).first())!.id
  const headers = { authorization: `Bearer ${issueToken(user.id, testConfig().auth).token}`, 'content-type': 'application/json' }
  // a published puzzle (Project Euler problem 96, grid 01: tests/fixtures/classic-puzzles.json), under a title of our own
  const draft = { ...draftOf('PE01'), title: 'Lantern Steps' }
  const puzzle = await (await fetch(`${suite.url}/api/channels/${channelId}/puzzles`, { method: 'POST', headers, body: JSON.stringify(draft) })).json()
  const res = await fetch(`${suite.url}/api/channels/${channelId}/puzzles/${puzzle.id}/outlines`, { method: 'POST', headers, body: JSON.stringify({ name: 'Evening take' }) })
  expect(res.status).toBe(201)
  return { channelId, puzzleTitle: draft.title }
}

describe('owner: plans a take on the board and finds it on the schedule (Chromium)', () => {
  it('should plan the take on the next free slot with a person on it, then show it on that day of the calendar', async () => {
    const { channelId, puzzleTitle } = await takeToPlan()
    const page = await suite.browser.newPage({ viewport: { width: 1440, height: 900 } })
    await page.goto(`${suite.url}/channels/${channelId}/board`)
    await page.getByLabel('E-mail').fill(owner.email)
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()

    const card = page.getByRole('article', { name: `${puzzleTitle}, Evening take` })
    await card.waitFor()
    await card.getByRole('button', { name: `Plan ${puzzleTitle}, Evening take` }).click()
    const dialog = page.getByRole('dialog')
    // nothing else is planned, so the next free slot is today (UTC, as the schedule reads days)
    const today = new Date().toISOString().slice(0, 10)
    await dialog.getByRole('button', { name: /^Next free slot: / }).click()
    expect(await dialog.getByLabel('Planned publish day').inputValue()).toBe(today)
    await dialog.getByRole('combobox', { name: 'Who is on it' }).click()
    await page.getByRole('option', { name: 'Priya Castellanos' }).click()
    await dialog.getByRole('button', { name: 'Save plan' }).click()
    await dialog.waitFor({ state: 'hidden' })
    await card.getByText('Priya Castellanos').waitFor()

    await page.getByRole('navigation', { name: 'Channel pipeline' }).getByRole('link', { name: 'Schedule' }).click()
    await page.getByRole('heading', { name: 'Schedule' }).waitFor()
    const day = page.locator(`td[data-day="${today}"]`)
    await day.getByRole('link', { name: new RegExp(puzzleTitle) }).waitFor()
    expect(await page.getByRole('region', { name: 'Not planned yet' }).count()).toBe(0)
    await page.close()
  })
})
