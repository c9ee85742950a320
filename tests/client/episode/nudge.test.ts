import { describe, expect, it } from 'vitest'
import { TECHNIQUES } from '@shared/engine'
import type { Step } from '@shared/schemas/step'
import { nudgeArea, nudgeKind } from '@/episode/nudge'
import { outlineFor } from '../../helpers/studio-outline'

const outlines = ['PE01', 'GT07', 'GT13'].map((id) => outlineFor(id))
const firstOf = (kind: Step['facts']['kind']) => {
  for (const o of outlines) {
    const step = o.steps.find((s) => s.facts.kind === kind)
    if (step) return { step, thermometers: o.puzzle.thermometers }
  }
  throw new Error(`no ${kind} step in the fixture takes`)
}

describe('nudgeArea', () => {
  it('should point at the house of an only-place step, without its cell or digit', () => {
    const { step, thermometers } = firstOf('single-house')
    if (step.facts.kind !== 'single-house') throw new Error('narrowing')
    const area = nudgeArea(step, thermometers)
    expect(area.text).toBe(`Look at ${step.facts.house.kind} ${step.facts.house.index + 1}.`)
    expect(area.houses).toEqual([step.facts.house])
    expect(area.text).not.toMatch(/\d.*\d|= /)
  })

  it('should point at a thermometer by where its bulb sits', () => {
    const { step, thermometers } = firstOf('thermo-length')
    if (step.facts.kind !== 'thermo-length') throw new Error('narrowing')
    const bulb = thermometers[step.facts.thermometer]![0]!
    const area = nudgeArea(step, thermometers)
    expect(area.text).toBe(`Look at the thermometer with its bulb in row ${Math.floor(bulb / 9) + 1}, column ${(bulb % 9) + 1}.`)
    expect(area).toMatchObject({ houses: [], thermometers: [step.facts.thermometer] })
  })

  it('should point at the box a last-candidate cell sits in, not at the cell', () => {
    const { step, thermometers } = firstOf('single-cell')
    if (step.facts.kind !== 'single-cell') throw new Error('narrowing')
    const c = step.facts.cell
    const box = 3 * Math.floor(c / 27) + Math.floor((c % 9) / 3)
    expect(nudgeArea(step, thermometers)).toMatchObject({ text: `Look at box ${box + 1}.`, houses: [{ kind: 'box', index: box }] })
  })
})

describe('nudgeKind', () => {
  it('should name the kind of step in plain words first', () => {
    const { step } = firstOf('single-house')
    expect(nudgeKind(step)).toBe(TECHNIQUES[step.technique].plainName)
  })
})
