import { describe, expect, it } from 'vitest'
import { DEMO_PUZZLES, seed as seedPuzzles } from '../../seeds/02_demo_puzzles'
import { useApiSuite } from '../helpers/api'

const api = useApiSuite()

describe('seeds/02_demo_puzzles', () => {
  it('should add two unique puzzles and an outline of the thermometer one, once', async () => {
    await seedPuzzles(api.db)
    await seedPuzzles(api.db)
    const puzzles = await api.db('puzzles').orderBy('id')
    expect(puzzles.map((p) => [p.title, p.check, p.thermometers.length > 0])).toEqual([
      ['Quiet Harbour', 'unique', false],
      ['Four Fevers', 'unique', true],
    ])
    const outlines = await api.db('outlines')
    expect(outlines).toHaveLength(1)
    expect(outlines[0]).toMatchObject({ puzzle_id: puzzles[1].id, name: 'First take', status: 'solved' })
    expect(outlines[0].document.author).toBe('Ilse Marchetti')
  })

  it('should credit invented setters with addresses on the example domain', () => {
    for (const p of DEMO_PUZZLES) expect(p.link).toMatch(/^https:\/\/puzzles\.example\//)
    expect(DEMO_PUZZLES.map((p) => p.author)).toEqual(['Dawit Brennan', 'Ilse Marchetti'])
  })
})
