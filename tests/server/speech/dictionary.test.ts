/**
 * takePronunciations against the English pronouncing dictionary pocketsphinx-en-us ships (CMU's, in its
 * phone set) and English spelling rules (common practice): the possessive 's is said IH Z after a hissing
 * sound, S after another voiceless sound, Z otherwise; British "-lled" is American "-led".
 */
import { beforeAll, describe, expect, it } from 'vitest'
import { dictionaryText, loadPronunciations, takePronunciations, type Pronunciations } from '../../../server/speech/dictionary'

let pronunciations: Pronunciations
beforeAll(async () => {
  pronunciations = await loadPronunciations()
})

describe('takePronunciations', () => {
  it('should keep the dictionary’s own lines, variants included', () => {
    const take = takePronunciations(['the', 'box'], pronunciations)
    expect(take.get('box')).toEqual(['box B AA K S'])
    expect(take.get('the')?.length).toBeGreaterThan(1)
    expect(take.get('the')?.[1]).toMatch(/^the\(2\) /)
  })

  it('should make possessives the dictionary lacks from the word and its ending', () => {
    const take = takePronunciations(["box's", "digit's", "cell's"], pronunciations)
    expect(take.get("box's")).toEqual(["box's B AA K S IH Z"])
    expect(take.get("digit's")?.[0]).toMatch(/^digit's .* T S$/)
    expect(take.get("cell's")?.[0]).toMatch(/^cell's .* L Z$/)
  })

  it('should read British doubled l as the American spelling, and know the trade’s own word', () => {
    const take = takePronunciations(['pencilled', 'sudoku'], pronunciations)
    expect(take.get('pencilled')).toEqual(['pencilled P EH N S AH L D'])
    expect(take.get('sudoku')).toEqual(['sudoku S UW D OW K UW'])
  })

  it('should leave out words it cannot pronounce, and write one dictionary line per pronunciation', () => {
    const take = takePronunciations(['box', 'zorblat', 'box'], pronunciations)
    expect([...take.keys()]).toEqual(['box'])
    expect(dictionaryText(take)).toBe('box B AA K S\n')
  })
})
