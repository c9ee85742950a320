import { describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, DEMO_USERS } from '../../seeds/01_demo_channel'
import { useBrowserSuite } from '../helpers/browser'
import { linkIn, nextMailTo, STRONG_PASSWORD } from '../helpers/mail'

const suite = useBrowserSuite()
const owner = DEMO_USERS.find((u) => u.role === 'owner')!
// an invented newcomer
const newcomer = { email: 'noor.haddad@example.test', name: 'Noor Haddad' }

describe('owner invites an editor, who signs up from the mail (Chromium)', () => {
  it('should list the invitation, mail its link, and bring the new editor into the channel', async () => {
    const channel = (await suite.db('channels').where({ slug: 'marigold-logic' }).first())!
    const ownerPage = await suite.browser.newPage()
    await ownerPage.goto(`${suite.url}/channels/${channel.id}/members`)
    await ownerPage.getByLabel('E-mail').fill(owner.email)
    await ownerPage.getByLabel('Password', { exact: true }).fill(DEMO_PASSWORD)
    await ownerPage.getByRole('button', { name: 'Sign in' }).click()

    await ownerPage.getByRole('button', { name: 'Invite someone' }).click()
    const dialog = ownerPage.getByRole('dialog', { name: 'Invite someone' })
    await dialog.getByLabel('E-mail address').fill(newcomer.email)
    await dialog.getByRole('combobox', { name: 'Role' }).click()
    await ownerPage.getByRole('option', { name: /^Editor/ }).click()
    const mail = nextMailTo(newcomer.email)
    await dialog.getByRole('button', { name: 'Send invitation' }).click()
    await ownerPage.getByRole('list', { name: 'Pending invitations' }).getByText(newcomer.email).waitFor()
    await ownerPage.close()

    // the newcomer's own browser: a fresh context, nobody signed in
    const { token } = linkIn(await mail, '/invitations/')
    const context = await suite.browser.newContext()
    const page = await context.newPage()
    await page.goto(`${suite.url}/invitations/${token}`)
    await page.getByRole('heading', { name: `Join ${channel.name}` }).waitFor()
    await page.getByLabel('Your name').fill(newcomer.name)
    await page.getByLabel('Choose a password').fill(STRONG_PASSWORD)
    await page.getByRole('button', { name: 'Create account and join' }).click()

    await page.getByRole('heading', { level: 1, name: 'Library' }).waitFor()
    expect(new URL(page.url()).pathname).toBe(`/channels/${channel.id}`)
    await page.getByText(channel.name).first().waitFor()
    const person = (await suite.db('users').where({ email: newcomer.email }).first())!
    const joined = await suite.db('memberships').where({ user_id: person.id, channel_id: channel.id }).first()
    expect(joined?.role).toBe('editor')
    await context.close()
  })
})
