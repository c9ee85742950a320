import { describe, expect, it } from 'vitest'
import { screen, within } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import StudioExportMenu from '@/components/StudioExportMenu.vue'
import { renderComponent } from './render'

async function openPictureDialog(step: number) {
  const user = userEvent.setup()
  const view = renderComponent(StudioExportMenu, { props: { step } })
  await user.click(screen.getByRole('button', { name: 'Export' }))
  // PrimeVue's menu listens on the item's content, inside the element with the menuitem role
  const item = await screen.findByRole('menuitem', { name: 'Grid picture (PNG)…' })
  await user.click(within(item).getByText('Grid picture (PNG)…'))
  const dialog = await screen.findByRole('dialog', { name: 'Grid picture' })
  return { user, view, dialog }
}

describe('StudioExportMenu', () => {
  it('should offer a grid picture of the step on screen, wide with highlights, by default', async () => {
    const { user, view, dialog } = await openPictureDialog(12)
    expect(within(dialog).getByRole('radio', { name: 'After step 12 (on screen now)' })).toBeChecked()
    expect(within(dialog).getByRole('radio', { name: 'Wide, 1280 × 720 (video thumbnail)' })).toBeChecked()
    expect(within(dialog).getByRole('checkbox', { name: "Show the step's highlights" })).toBeChecked()
    await user.click(within(dialog).getByRole('button', { name: 'Download PNG' }))
    expect(view.emitted('picture')).toEqual([[{ step: 12, shape: 'wide', highlights: 'on' }]])
    expect(screen.queryByRole('dialog', { name: 'Grid picture' })).not.toBeInTheDocument()
  })

  it('should ask for the start, square and plain when those are chosen', async () => {
    const { user, view, dialog } = await openPictureDialog(5)
    await user.click(within(dialog).getByRole('radio', { name: 'The start: givens only' }))
    await user.click(within(dialog).getByRole('radio', { name: 'Square, 1080 × 1080' }))
    await user.click(within(dialog).getByRole('checkbox', { name: "Show the step's highlights" }))
    await user.click(within(dialog).getByRole('button', { name: 'Download PNG' }))
    expect(view.emitted('picture')).toEqual([[{ step: 0, shape: 'square', highlights: 'off' }]])
  })

  it('should offer no step choice before the first step, and send nothing when cancelled', async () => {
    const { user, view, dialog } = await openPictureDialog(0)
    expect(within(dialog).queryByRole('radio', { name: /After step/ })).not.toBeInTheDocument()
    await user.click(within(dialog).getByRole('button', { name: 'Cancel' }))
    expect(view.emitted('picture')).toBeUndefined()
  })
})
