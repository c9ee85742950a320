import { describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { useBrowserSuite } from '../helpers/browser'
import { draftOf } from '../helpers/studio'

const suite = useBrowserSuite()

/** A puzzle (Project Euler 96, grid 01) and its first take, made through the API as the demo presenter. */
async function takeOfThePresenter(): Promise<{ id: number; channelId: number }> {
  const call = async (path: string, body: unknown, token?: string) => {
    const res = await fetch(`${suite.url}/api${path}`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', ...(token ? { Authorization: `Bearer ${token}` } : {}) },
      body: JSON.stringify(body),
    })
    if (!res.ok) throw new Error(`POST ${path} answered ${res.status}: ${await res.text()}`)
    return (await res.json()) as { id: number; token: string }
  }
  const { token } = await call('/auth/sign-in', { email: 'presenter@gridcue.example', password: DEMO_PASSWORD })
  const channel = (await suite.db('channels').where({ slug: 'marigold-logic' }).first('id'))!
  const puzzle = await call(`/channels/${channel.id}/puzzles`, draftOf('PE01'), token)
  const take = await call(`/channels/${channel.id}/puzzles/${puzzle.id}/outlines`, {}, token)
  return { id: take.id, channelId: channel.id }
}

describe('presenter: a timed rehearsal on the prompter, then estimate against run in the studio (Chromium)', () => {
  it('should advance three lines with the keyboard, save the run and show it beside the estimate', async () => {
    const take = await takeOfThePresenter()

    // a tablet held upright beside the camera
    const page = await suite.browser.newPage({ viewport: { width: 768, height: 1024 } })
    await page.goto(suite.url)
    await page.getByLabel('E-mail').fill('presenter@gridcue.example')
    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByText('Marigold Logic').first().waitFor()
    await page.goto(`${suite.url}/channels/${take.channelId}/outlines/${take.id}`)
    await page.getByRole('link', { name: 'Rehearse with the prompter' }).click()
    await page.waitForURL(/\/prompter$/)

    const current = page.getByTestId('prompter-current')
    await current.waitFor()
    const first = await current.textContent()
    // Space starts the run; three presses of → advance three lines
    await page.keyboard.press('Space')
    const seen = [first]
    for (let i = 0; i < 3; i++) {
      await page.waitForTimeout(300)
      await page.keyboard.press('ArrowRight')
      await expect.poll(() => current.textContent()).not.toBe(seen.at(-1))
      seen.push(await current.textContent())
    }
    await page.keyboard.press('e')
    await page.getByRole('heading', { name: 'Run finished' }).waitFor()
    await page.getByLabel('Name of the run').fill('Tablet run')
    await page.getByRole('button', { name: 'Save the run' }).click()
    await page.getByRole('status').getByText('Saved “Tablet run”').waitFor()

    const stored = await suite.db('rehearsals').where({ outline_id: take.id }).first()
    expect(stored?.name).toBe('Tablet run')
    // the line on screen when E was pressed is timed too: four lines
    expect(stored?.lines).toHaveLength(4)

    await page.getByRole('link', { name: 'Back to the studio' }).click()
    await page.getByRole('button', { name: 'Estimate and rehearsals' }).click()
    const table = page.getByRole('dialog').getByRole('table')
    await table.getByRole('columnheader', { name: 'Tablet run' }).waitFor()
    await table.getByRole('columnheader', { name: 'Estimate' }).waitFor()
    // the first line's row has an estimate and the run's time, in seconds
    const row = table.getByRole('row').nth(1)
    await expect.poll(async () => (await row.getByRole('cell').allTextContents()).slice(2)).toEqual([expect.stringMatching(/s$/), expect.stringMatching(/^\d+\.\d s$/)])
    await page.close()
  })
})
