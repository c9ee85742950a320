import { describe, expect, test } from 'vitest'
import { spokenWords } from '../../../shared/align/words'

describe('spokenWords', () => {
  test('spokenWords("Row 3 can\'t take a 7.") => lower case, digits as words, the contraction kept whole', () => {
    expect(spokenWords("Row 3 can't take a 7.")).toEqual(['row', 'three', "can't", 'take', 'a', 'seven'])
  })

  test('spokenWords(r3c4) => "row three column four" (rNcM is the trade\'s cell notation: row N, column M)', () => {
    expect(spokenWords('so r3c4 is 5')).toEqual(['so', 'row', 'three', 'column', 'four', 'is', 'five'])
  })

  // English number names (common practice): teens are one word, tens and units two, hundreds and thousands named.
  test.each([
    ['15', ['fifteen']],
    ['40', ['forty']],
    ['45', ['forty', 'five']],
    ['100', ['one', 'hundred']],
    ['1,024', ['one', 'thousand', 'twenty', 'four']],
    ['2.5', ['two', 'point', 'five']],
    ['1st', ['first']],
    ['22nd', ['twenty', 'second']],
    ['3rd', ['third']],
    ['90th', ['ninetieth']],
    ['007', ['zero', 'zero', 'seven']],
  ])('spokenWords(%s) => %j', (text, words) => {
    expect(spokenWords(text)).toEqual(words)
  })

  test('curly apostrophes read as straight ones and quotes, dashes and ellipses are not words', () => {
    expect(spokenWords('“It’s the top-left box…” — r1c1!')).toEqual(["it's", 'the', 'top', 'left', 'box', 'row', 'one', 'column', 'one'])
  })

  test('spokenWords of punctuation alone => no words', () => {
    expect(spokenWords(' — … !? ')).toEqual([])
  })
})
