import { describe, expect, it } from 'vitest'
import { fireEvent, screen, within } from '@testing-library/vue'
import type { Calibration, RehearsalRun } from '@shared/schemas/rehearsal'
import StudioRehearsalDialog from '@/components/StudioRehearsalDialog.vue'
import { outlineFor } from '../helpers/studio-outline'
import { renderComponent } from './render'

const work = { words: 10, placements: 0, marks: 0, whatIfMoves: 0 }

function runOf(id: number, name: string, times: [number, number][]): RehearsalRun {
  const lines = times.map(([lineId, ms]) => ({ lineId, ms, isBreak: ms > 60_000, work }))
  return { id, outlineId: 31, name, presenterId: 7, presenterName: 'Ada Lane', lines, speechMs: lines.reduce((s, l) => s + (l.isBreak ? 0 : l.ms), 0), createdAt: '2026-12-02T10:00:00.000Z' }
}

const preview = { audioUrl: null, busy: false, error: null }

describe('StudioRehearsalDialog', () => {
  it("shows each line's estimate beside each run, a break as a break, and the totals", async () => {
    const doc = outlineFor('PE01')
    const [a, b] = doc.lines
    const runs = [runOf(2, 'Second go', [[a.id, 12_000], [b.id, 75_000]]), runOf(1, 'First go', [[a.id, 9500]])]
    const { emitted } = renderComponent(StudioRehearsalDialog, { props: { visible: true, outline: doc, runs, calibration: null, canRehearse: true, preview } })

    const table = await screen.findByRole('table')
    const headers = within(table).getAllByRole('columnheader').map((h) => h.textContent)
    expect(headers).toEqual(['Line', 'Text', 'Estimate', 'Second go', 'First go'])
    const first = within(table).getAllByRole('row')[1]
    expect(within(first).getAllByRole('cell').map((c) => c.textContent)).toEqual(['1', expect.any(String), `${(a.estMs / 1000).toFixed(1)} s`, '12.0 s', '9.5 s'])
    const second = within(table).getAllByRole('row')[2]
    expect(within(second).getAllByRole('cell').slice(3).map((c) => c.textContent)).toEqual(['break', '—'])
    // totals: the break is not speech; 0:12 and 0:09
    const total = within(table).getAllByRole('row').at(-1)!
    expect(within(total).getAllByRole('cell').slice(1).map((c) => c.textContent)).toEqual(['0:12', '0:09'])
    expect(screen.getByText(/take's own model/)).toBeInTheDocument()

    await fireEvent.click(screen.getByRole('button', { name: 'Discard First go' }))
    expect(emitted().discard).toEqual([[1]])
  })

  it("estimates with the presenter's calibrated timing when there is one, and says whose", async () => {
    const doc = outlineFor('PE01')
    const calibration: Calibration = { presenterId: 7, presenterName: 'Ada Lane', pace: 200, placementMs: 0, markMs: 0, whatIfMoveMs: 0, pauseMs: 0, lineCount: 40 }
    renderComponent(StudioRehearsalDialog, { props: { visible: true, outline: doc, runs: [runOf(1, 'Run 1', [[doc.lines[0].id, 5000]])], calibration, canRehearse: false, preview } })
    expect(await screen.findByText(/Ada Lane's timing, fitted from 40 rehearsed lines: 200 words a minute/)).toBeInTheDocument()
    // at 200 wpm with no action or pause time a line of n words takes n × 0.3 s (60 000 ms / 200)
    const words = doc.lines[0].text.split(/\s+/).filter((w) => /[\p{L}\p{N}]/u.test(w)).length
    const row = within(screen.getByRole('table')).getAllByRole('row')[1]
    expect(within(row).getAllByRole('cell')[2]).toHaveTextContent(`${((words * 300) / 1000).toFixed(1)} s`)
    // an editor reads runs but doesn't rehearse: no discard, no preview
    expect(screen.queryByRole('button', { name: /Discard/ })).not.toBeInTheDocument()
    expect(screen.queryByRole('button', { name: 'Make the preview' })).not.toBeInTheDocument()
  })

  it('asks for a read-aloud preview of the chosen stretch and labels it a preview', async () => {
    const doc = outlineFor('PE01')
    const { emitted, rerender } = renderComponent(StudioRehearsalDialog, { props: { visible: true, outline: doc, runs: [], calibration: null, canRehearse: true, preview } })
    await fireEvent.update(await screen.findByLabelText('to line'), String(doc.lines[1].id))
    await fireEvent.click(screen.getByRole('button', { name: 'Make the preview' }))
    expect(emitted().preview).toEqual([[doc.lines[0].id, doc.lines[1].id]])
    await rerender({ preview: { audioUrl: 'blob:preview', busy: false, error: null } })
    expect(screen.getByLabelText('Read-aloud preview (synthetic voice)')).toBeInTheDocument()
    expect(screen.getByText(/Not a voice for the video/)).toBeInTheDocument()
  })
})
