import { describe, expect, it } from 'vitest'
import { render, screen } from '@testing-library/vue'
import EpisodeApp from '@/episode/EpisodeApp.vue'
import '../render'
import { episodePageFor } from './page-fixture'

describe('EpisodeApp', () => {
  it('should ask someone not signed in to sign in for a members-only episode, and bring them back', () => {
    const signInHref = '/sign-in?redirect=%2Fepisodes%2Fquince-street%2Fclub-night'
    render(EpisodeApp, { props: { start: { kind: 'members-only', signInHref } } })
    expect(screen.getByRole('heading', { name: 'Members only — sign in' })).toBeInTheDocument()
    expect(screen.getByRole('link', { name: 'Sign in' })).toHaveAttribute('href', signInHref)
  })

  it('should say so when there is no episode for this person at the address', () => {
    render(EpisodeApp, { props: { start: { kind: 'missing' } } })
    expect(screen.getByText('There is no episode at this address.')).toBeInTheDocument()
  })

  it('should name the tab after an episode it fetched itself (the server names the ones it sends)', () => {
    document.title = 'Members only · Gridcue'
    const page = episodePageFor('PE01')
    render(EpisodeApp, { props: { start: { kind: 'page', page, fetched: true } } })
    expect(document.title).toBe(`${page.episode.title} · ${page.channel.name}`)
    expect(screen.getByRole('heading', { level: 1, name: page.episode.title })).toBeInTheDocument()
  })
})
