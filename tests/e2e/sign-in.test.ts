import { describe, expect, it } from 'vitest'
import { DEMO_PASSWORD } from '../../seeds/01_demo_channel'
import { useBrowserSuite } from '../helpers/browser'

const suite = useBrowserSuite()

describe('signing in (Chromium)', () => {
  it('should send an anonymous visitor to sign-in, then show the demo channel on the home page', async () => {
    const page = await suite.browser.newPage()
    await page.goto(suite.url)
    await page.getByRole('heading', { name: 'Sign in' }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/sign-in')

    await page.getByLabel('E-mail').fill('presenter@gridcue.example')
    await page.getByLabel('Password', { exact: true }).fill('wrong password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByText('E-mail or password is wrong').waitFor()

    await page.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
    await page.getByRole('button', { name: 'Sign in' }).click()
    await page.getByRole('heading', { name: 'Your channels' }).waitFor()
    await page.getByText('Marigold Logic').first().waitFor()
    expect(await page.getByText('Tomasz Ebi').count()).toBeGreaterThan(0)

    await page.getByRole('button', { name: /sign out/i }).click()
    await page.getByRole('heading', { name: 'Sign in' }).waitFor()
    await page.close()
  })

  it('should show the not-found page for an unknown address', async () => {
    const page = await suite.browser.newPage()
    await page.goto(`${suite.url}/no/such/page`)
    await page.getByText(/not found|doesn.t exist|no page/i).first().waitFor()
    await page.close()
  })
})
