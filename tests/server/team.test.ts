/**
 * Channels and their people through the API, with mail through the local fake SMTP server: each caught
 * mail is parsed by mailparser (a third-party RFC 5322 parser), and its link followed as a person would.
 */
import { describe, expect, it } from 'vitest'
import { STRONG_PASSWORD, linkIn, nextMailTo } from '../helpers/mail'
import { useApiSuite } from '../helpers/api'

const api = useApiSuite()

const NEWCOMER = 'wren.talbot@gridcue.example'

/** The owner invites an address; resolves with the invitation's answer and the link's token from the caught mail. */
async function inviteByMail(email = NEWCOMER, role = 'editor') {
  const mail = nextMailTo(email)
  const res = await api.as('owner').post(`/api/channels/${api.channelId}/invitations`, { email, role })
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  const caught = await mail
  return { invitation: res.body, mail: caught, token: linkIn(caught, '/invitations/').token }
}

describe('channels', () => {
  it('should make the creator the only owner of a new channel, with an address name from its name', async () => {
    const res = await api.as('editor').post('/api/channels', { name: 'Côte Grids!', description: 'Evening puzzles.' })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({ name: 'Côte Grids!', slug: 'cote-grids', role: 'owner', memberCount: 1 })
    // a person in several channels, with a different role in each
    const mine = await api.as('editor').get('/api/channels')
    expect(mine.body.map((c: { slug: string; role: string }) => [c.slug, c.role])).toEqual([
      ['cote-grids', 'owner'],
      ['marigold-logic', 'editor'],
    ])
    const again = await api.as('viewer').post('/api/channels', { name: 'Cote grids' })
    expect(again.body.slug).toBe('cote-grids-2')
  })

  it('should let an owner rename the channel and keep its address name', async () => {
    const res = await api.as('owner').patch(`/api/channels/${api.channelId}`, { name: 'Marigold Logic Weekly', description: 'New words.' })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ name: 'Marigold Logic Weekly', slug: 'marigold-logic', description: 'New words.' })
  })

  it('should refuse an empty channel name with a sentence', async () => {
    const res = await api.as('owner').post('/api/channels', { name: '   ' })
    expect(res.status).toBe(400)
    expect(res.body.message).toBe('body.name: Give the channel a name')
  })
})

describe('invitations', () => {
  it('should mail a link with which a newcomer signs up and joins with the invited role', async () => {
    const { invitation, mail, token } = await inviteByMail()
    expect(invitation).toMatchObject({ email: NEWCOMER, role: 'editor', invitedBy: 'Noor Lindqvist', expired: false })
    // seven days, as the issue asks
    expect(new Date(invitation.expiresAt).getTime() - Date.now()).toBeGreaterThan(7 * 24 * 3600_000 - 60_000)
    expect(mail.subject).toBe('Noor Lindqvist asks you to join Marigold Logic on Gridcue')
    expect(mail.html).toContain(`/invitations/${token}`)
    // only a hash of the token is stored
    const stored = await api.db('invitations').where({ email: NEWCOMER }).first()
    expect(JSON.stringify(stored)).not.toContain(token)

    const seen = await api.as('anonymous').get(`/api/invitations/${token}`)
    expect(seen.body).toEqual({ channelName: 'Marigold Logic', role: 'editor', email: NEWCOMER, invitedBy: 'Noor Lindqvist', accountExists: false })

    const signUp = await api.as('anonymous').post(`/api/invitations/${token}/sign-up`, { name: 'Wren Talbot', password: STRONG_PASSWORD })
    expect(signUp.status, JSON.stringify(signUp.body)).toBe(201)
    expect(signUp.body.user).toMatchObject({ email: NEWCOMER, name: 'Wren Talbot' })
    const channels = await api.as('anonymous').get('/api/channels').set('Authorization', `Bearer ${signUp.body.token}`)
    expect(channels.body).toEqual([expect.objectContaining({ id: api.channelId, role: 'editor', memberCount: 5 })])
    const members = await api.as('owner').get(`/api/channels/${api.channelId}/members`)
    expect(members.body).toContainEqual({ userId: signUp.body.user.id, name: 'Wren Talbot', email: NEWCOMER, role: 'editor' })
    expect((await api.as('owner').get(`/api/channels/${api.channelId}/invitations`)).body).toEqual([])
  })

  it('should refuse a used link with a sentence saying so', async () => {
    const { token } = await inviteByMail()
    await api.as('anonymous').post(`/api/invitations/${token}/sign-up`, { name: 'Wren Talbot', password: STRONG_PASSWORD })
    for (const res of [await api.as('anonymous').get(`/api/invitations/${token}`), await api.as('non-member').post(`/api/invitations/${token}/accept`)]) {
      expect(res.status).toBe(410)
      expect(res.body).toEqual({ code: 'invitation-used', message: 'This invitation has been used already. Sign in to reach the channel, or ask its owner for a new invitation.' })
    }
  })

  it('should refuse an expired link with a sentence saying so', async () => {
    const { token } = await inviteByMail()
    await api.db('invitations').where({ email: NEWCOMER }).update({ expires_at: new Date(Date.now() - 1000) })
    const res = await api.as('anonymous').post(`/api/invitations/${token}/sign-up`, { name: 'Wren Talbot', password: STRONG_PASSWORD })
    expect(res.status).toBe(410)
    expect(res.body).toEqual({ code: 'invitation-expired', message: 'This invitation has expired (links work for seven days). Ask the channel owner to send a new one.' })
    expect(await api.db('users').where({ email: NEWCOMER }).first()).toBeUndefined()
  })

  it('should refuse an unknown link with a sentence saying so', async () => {
    const res = await api.as('anonymous').get('/api/invitations/not-a-real-token')
    expect(res.status).toBe(404)
    expect(res.body.code).toBe('invitation-unknown')
    expect(res.body.message).toMatch(/^This invitation link is not known\./)
  })

  it('should replace the old link when the invitation is sent again', async () => {
    const first = await inviteByMail(NEWCOMER, 'viewer')
    const second = await inviteByMail(NEWCOMER, 'presenter')
    expect(second.token).not.toBe(first.token)
    expect((await api.as('anonymous').get(`/api/invitations/${first.token}`)).body.code).toBe('invitation-unknown')
    expect((await api.as('anonymous').get(`/api/invitations/${second.token}`)).body.role).toBe('presenter')
    expect(await api.db('invitations').where({ email: NEWCOMER })).toHaveLength(1)
  })

  it('should let an existing account accept into the channel, and refuse signing up again with its address', async () => {
    const outsider = api.user('non-member')
    const { token } = await inviteByMail(outsider.email, 'presenter')
    expect((await api.as('anonymous').get(`/api/invitations/${token}`)).body.accountExists).toBe(true)
    const signUp = await api.as('anonymous').post(`/api/invitations/${token}/sign-up`, { name: 'Ada', password: STRONG_PASSWORD })
    expect(signUp.status).toBe(409)
    expect(signUp.body.code).toBe('account-exists')
    const accepted = await api.as('non-member').post(`/api/invitations/${token}/accept`)
    expect(accepted.body).toEqual({ channelId: api.channelId, role: 'presenter', alreadyMember: false })
    expect((await api.as('non-member').get(`/api/channels/${api.channelId}`)).body.role).toBe('presenter')
  })

  it('should refuse a weak password when signing up, creating nothing', async () => {
    const { token } = await inviteByMail()
    // a top entry of every common-password list (common practice), padded to the length rule
    const res = await api.as('anonymous').post(`/api/invitations/${token}/sign-up`, { name: 'Wren Talbot', password: 'password1234' })
    expect(res.status).toBe(400)
    expect(res.body.code).toBe('weak-password')
    expect((await api.as('anonymous').get(`/api/invitations/${token}`)).status).toBe(200)
  })

  it('should refuse to invite someone who is a member already', async () => {
    const res = await api.as('owner').post(`/api/channels/${api.channelId}/invitations`, { email: api.user('viewer').email.toUpperCase(), role: 'editor' })
    expect(res.status).toBe(409)
    expect(res.body.code).toBe('already-member')
  })

  it('should let an owner withdraw an invitation, after which its link is unknown', async () => {
    const { invitation, token } = await inviteByMail()
    expect((await api.as('owner').delete(`/api/channels/${api.channelId}/invitations/${invitation.id}`)).status).toBe(204)
    expect((await api.as('anonymous').get(`/api/invitations/${token}`)).status).toBe(404)
  })
})

describe('members and the last-owner rule', () => {
  const memberPath = (actor: 'owner' | 'viewer' | 'presenter') => `/api/channels/${api.channelId}/members/${api.user(actor).id}`

  it('should let an owner change a role', async () => {
    const res = await api.as('owner').patch(memberPath('viewer'), { role: 'editor' })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ userId: api.user('viewer').id, role: 'editor' })
  })

  it('should not let the last owner be demoted, remove themselves or leave', async () => {
    const demote = await api.as('owner').patch(memberPath('owner'), { role: 'editor' })
    expect(demote.status).toBe(409)
    expect(demote.body).toEqual({ code: 'last-owner', message: "A channel needs at least one owner, so the last one can't be given another role. Make someone else an owner first." })
    const leave = await api.as('owner').delete(`/api/channels/${api.channelId}/membership`)
    expect(leave.status).toBe(409)
    expect(leave.body.message).toBe("A channel needs at least one owner, so the last one can't leave. Make someone else an owner first.")
    expect((await api.as('owner').delete(memberPath('owner'))).status).toBe(409)
  })

  it('should let an owner step down once there is a second owner', async () => {
    await api.as('owner').patch(memberPath('presenter'), { role: 'owner' })
    const res = await api.as('owner').patch(memberPath('owner'), { role: 'viewer' })
    expect(res.status).toBe(200)
    // the former presenter is now the channel's only owner
    expect((await api.as('presenter').patch(memberPath('presenter'), { role: 'editor' })).status).toBe(409)
  })

  it('should let a member leave and an owner remove a member', async () => {
    expect((await api.as('viewer').delete(`/api/channels/${api.channelId}/membership`)).status).toBe(204)
    expect((await api.as('viewer').get(`/api/channels/${api.channelId}`)).status).toBe(404)
    expect((await api.as('owner').delete(memberPath('presenter'))).status).toBe(204)
    const members = await api.as('owner').get(`/api/channels/${api.channelId}/members`)
    expect(members.body.map((m: { role: string }) => m.role).sort()).toEqual(['editor', 'owner'])
  })

  it('should answer 404 for someone who is not a member', async () => {
    const res = await api.as('owner').patch(`/api/channels/${api.channelId}/members/${api.user('non-member').id}`, { role: 'editor' })
    expect(res.status).toBe(404)
    expect(res.body.message).toBe('Member not found')
  })
})
