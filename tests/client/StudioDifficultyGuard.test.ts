import { describe, expect, it } from 'vitest'
import { screen } from '@testing-library/vue'
import userEvent from '@testing-library/user-event'
import { buildOutline } from '@shared/script'
import StudioDifficultyGuard from '@/components/StudioDifficultyGuard.vue'
import { contradiction, nakedSingle, puzzle, rc, result } from '../shared/script/steps'
import { renderComponent } from './render'

// Twenty what-ifs with no digit, then a single: both signs of issue #13's guard (over 20% what-ifs, over 3 min dry).
const hard = buildOutline(
  puzzle(),
  result([...Array.from({ length: 20 }, (_, i) => contradiction(rc(1 + (i % 9), 1 + Math.floor(i / 9)), 2 + (i % 7), rc(9, 9))), nakedSingle(rc(5, 5))]),
)

describe('StudioDifficultyGuard', () => {
  it('says what is hard and where, and takes the presenter to the line', async () => {
    const { emitted } = renderComponent(StudioDifficultyGuard, { props: { outline: hard } })
    expect(screen.getByText(/What-ifs take \d+:\d\d of \d+:\d\d \(\d+%\), over the 20%/)).toBeTruthy()
    expect(screen.getByText(/No digit is placed for \d+:\d\d from \d+:\d\d \(lines 2–21\), over 3:00/)).toBeTruthy()
    await userEvent.click(screen.getByRole('button', { name: 'Go to line 2' }))
    expect(emitted()['select-line']).toEqual([[2]])
    await userEvent.click(screen.getByRole('button', { name: /Go to the longest, line \d+/ }))
    expect(emitted()['select-line']).toHaveLength(2)
  })

  it('shows nothing for an easy script with its link', () => {
    const easy = buildOutline(puzzle(), result([nakedSingle(rc(1, 1)), nakedSingle(rc(5, 5))]), { link: 'https://example.com/p/9' })
    renderComponent(StudioDifficultyGuard, { props: { outline: easy } })
    expect(screen.queryByTestId('difficulty-guard')).toBeNull()
    expect(screen.queryByTestId('link-missing')).toBeNull()
  })

  it('warns while the puzzle link is a placeholder', () => {
    renderComponent(StudioDifficultyGuard, { props: { outline: buildOutline(puzzle(), result([nakedSingle(rc(1, 1))])) } })
    expect(screen.getByTestId('link-missing').textContent).toMatch(/puzzle link is still a placeholder/)
  })
})
