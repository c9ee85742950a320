import { describe, expect, it } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import PuzzleDetailsForm from '@/components/PuzzleDetailsForm.vue'
import type { PuzzleDetails } from '@/composables/usePuzzleForm'
import { renderComponent } from './render'

const details: PuzzleDetails = {
  title: 'Morning climb',
  author: 'Rosa Ilves',
  link: 'https://example.test/puzzles/morning-climb',
  publishedOn: '2025-04-28',
  notes: 'Second in the series',
}

describe('PuzzleDetailsForm', () => {
  it('should show each detail in its labelled field', () => {
    renderComponent(PuzzleDetailsForm, { props: { details } })

    expect(screen.getByLabelText('Title')).toHaveValue('Morning climb')
    expect(screen.getByLabelText('Title')).toBeRequired()
    expect(screen.getByLabelText('Setter')).toHaveValue('Rosa Ilves')
    expect(screen.getByLabelText('Link to the puzzle')).toHaveValue('https://example.test/puzzles/morning-climb')
    expect(screen.getByLabelText('First published')).toHaveValue('2025-04-28')
    expect(screen.getByLabelText('Notes')).toHaveValue('Second in the series')
  })

  it('should hand each edit back as new details and leave the ones it was given alone', async () => {
    const given = structuredClone(details)
    const { emitted } = renderComponent(PuzzleDetailsForm, { props: { details: given } })
    const user = userEvent.setup()

    await user.type(screen.getByLabelText('Setter'), '!')

    const updates = emitted<[PuzzleDetails]>('update:details')
    expect(updates.at(-1)).toEqual([{ ...details, author: 'Rosa Ilves!' }])
    expect(updates.at(-1)![0]).not.toBe(given)
    expect(given).toEqual(details)
  })

  it('should put a refused field’s message beside it, for the eye and for the screen reader', () => {
    renderComponent(PuzzleDetailsForm, { props: { details, errors: { link: 'Link must be a web address (https://…)' } } })

    const link = screen.getByLabelText('Link to the puzzle')
    expect(link).toBeInvalid()
    expect(link).toHaveAccessibleDescription('Link must be a web address (https://…)')
    expect(screen.getByLabelText('Title')).toBeValid()
  })

  it('should ask to save when Enter is pressed in a one-line field', async () => {
    const { emitted } = renderComponent(PuzzleDetailsForm, { props: { details } })
    const user = userEvent.setup()

    await user.type(screen.getByLabelText('Title'), '{Enter}')
    expect(emitted('submit')).toHaveLength(1)
  })

  it('should offer nothing to change when disabled', () => {
    renderComponent(PuzzleDetailsForm, { props: { details, disabled: true } })
    for (const label of ['Title', 'Setter', 'Link to the puzzle', 'First published', 'Notes']) {
      expect(screen.getByLabelText(label)).toBeDisabled()
    }
  })
})
