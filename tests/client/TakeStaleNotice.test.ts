import { describe, expect, it } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import TakeStaleNotice from '@/components/TakeStaleNotice.vue'
import { renderComponent } from './render'

const changes = { givens: { added: 2, removed: 0, changed: 0 }, thermometers: { added: 1, removed: 0 } }

describe('TakeStaleNotice', () => {
  it('should say what changed and offer to find the path again', async () => {
    const view = renderComponent(TakeStaleNotice, { props: { changes, canRefresh: true } })
    expect(screen.getByText(/The puzzle changed after this take was made \(2 givens added and 1 thermometer added\)/)).toBeVisible()
    await userEvent.setup().click(screen.getByRole('button', { name: 'Find the path again' }))
    expect(view.emitted('refresh')).toHaveLength(1)
  })

  it('should tell someone who cannot make takes who can', () => {
    renderComponent(TakeStaleNotice, { props: { changes, canRefresh: false } })
    expect(screen.queryByRole('button', { name: 'Find the path again' })).toBeNull()
    expect(screen.getByText(/An owner or presenter can find the path again/)).toBeVisible()
  })

  it('should report what was kept and hand back the words of lines whose steps are gone', () => {
    renderComponent(TakeStaleNotice, { props: { changes: null, outcome: { kept: 3, lost: ['Now a given, so no step.'] } } })
    expect(screen.getByRole('status')).toHaveTextContent('Path found again; 3 of your lines were kept where their steps still happen.')
    expect(screen.getByRole('list', { name: /their words, to reuse/ })).toHaveTextContent('Now a given, so no step.')
  })

  it('should show nothing for a current take', () => {
    const view = renderComponent(TakeStaleNotice, { props: { changes: null } })
    expect(view.container.textContent?.trim()).toBe('')
  })
})
