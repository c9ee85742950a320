/**
 * Text as the words a person says aloud, so a script line, a caption and a recogniser's output compare word for word.
 */

const ONES = ['zero', 'one', 'two', 'three', 'four', 'five', 'six', 'seven', 'eight', 'nine', 'ten', 'eleven', 'twelve',
  'thirteen', 'fourteen', 'fifteen', 'sixteen', 'seventeen', 'eighteen', 'nineteen']
const TENS = ['', '', 'twenty', 'thirty', 'forty', 'fifty', 'sixty', 'seventy', 'eighty', 'ninety']
const ORDINALS: Record<string, string> = {
  one: 'first', two: 'second', three: 'third', five: 'fifth', eight: 'eighth', nine: 'ninth', twelve: 'twelfth',
}
const SYMBOLS: Record<string, string> = { '&': ' and ', '%': ' percent ', '+': ' plus ', '=': ' equals ' }

/**
 * A script line or caption text as the lower-case words a person says: digits and numbers as words ("7" → "seven",
 * "15" → "fifteen"), r3c4 → "row three column four", punctuation dropped, contractions kept as one word ("can't").
 */
export function spokenWords(text: string): string[] {
  const cleaned = text
    .normalize('NFKC')
    .toLowerCase()
    .replace(/[\u2018\u2019\u02bc]/g, "'")
    .replace(/[&%+=]/g, (s) => SYMBOLS[s])
    // "r3c4" and "r3c4-r3c6": a coordinate is read out as its row and column
    .replace(/\br(\d+)c(\d+)\b/g, ' row $1 column $2 ')
    // thousands separators ("1,000") belong to the number, not the sentence
    .replace(/(\d),(?=\d{3}\b)/g, '$1')
  const words: string[] = []
  for (const token of cleaned.split(/[^\p{L}\p{N}'.]+/u)) {
    // most tokens are plain words: skip the number handling for them
    if (/^[a-z]+$/.test(token)) {
      words.push(token)
      continue
    }
    for (const part of token.split(/(\d+(?:\.\d+)?(?:st|nd|rd|th)?)/)) {
      if (/^\d/.test(part)) words.push(...numberWords(part))
      else words.push(...plainWords(part))
    }
  }
  return words
}

/** Letters and apostrophes only; a full stop or stray quote is punctuation, an inner apostrophe is part of the word. */
function plainWords(part: string): string[] {
  return part.split('.').map((w) => w.replace(/^'+|'+$/g, '')).filter((w) => /\p{L}/u.test(w))
}

/** "15" → fifteen, "2.5" → two point five, "3rd" → third. */
function numberWords(token: string): string[] {
  const ordinal = /(st|nd|rd|th)$/.test(token)
  const digits = ordinal ? token.slice(0, -2) : token
  const [whole, fraction] = digits.split('.')
  const words = wholeNumberWords(whole)
  if (fraction) words.push('point', ...[...fraction].map((d) => ONES[Number(d)]))
  else if (ordinal) words.push(ordinalOf(words.pop() ?? ''))
  return words
}

function wholeNumberWords(digits: string): string[] {
  // Long digit runs (and leading zeros) are read digit by digit, the way people say codes.
  if (digits.length > 9 || (digits.length > 1 && digits.startsWith('0'))) return [...digits].map((d) => ONES[Number(d)])
  return belowBillion(Number(digits))
}

function belowBillion(n: number): string[] {
  if (n < 20) return [ONES[n]]
  if (n < 100) return n % 10 === 0 ? [TENS[n / 10]] : [TENS[Math.floor(n / 10)], ONES[n % 10]]
  const scales: [number, string][] = [[1_000_000, 'million'], [1000, 'thousand'], [100, 'hundred']]
  for (const [size, name] of scales) {
    if (n >= size) {
      const rest = n % size
      return [...belowBillion(Math.floor(n / size)), name, ...(rest ? belowBillion(rest) : [])]
    }
  }
  return []
}

function ordinalOf(word: string): string {
  if (ORDINALS[word]) return ORDINALS[word]
  if (word.endsWith('y')) return `${word.slice(0, -1)}ieth`
  return `${word}th`
}
