// The text building block every text field of the wire contract uses. Outside facts it checks against:
// PostgreSQL refuses U+0000 in text and jsonb ("invalid byte sequence" / "unsupported Unicode escape
// sequence", PostgreSQL docs 8.3 and 8.14), and a lone UTF-16 surrogate has no UTF-8 encoding (Unicode
// 15, section 3.9, D91-D92), so neither can be stored as sent.
import { describe, expect, test } from 'vitest'
import { text, webAddress } from '../../../shared/schemas/text'

const title = text({ label: 'title', max: 10, required: true, trim: true })
const notes = text({ label: 'notes', max: 10 })
const messages = (result: { error?: { issues: { message: string }[] } }) => result.error?.issues.map((i) => i.message)

describe('text()', () => {
  test('text(plain words, emoji, tabs and line breaks) => kept as sent', () => {
    for (const value of ['Thermo 7', '🌡️ rising', 'a\tb\nc', 'Ünïcödé']) expect(notes.parse(value)).toBe(value)
  })

  test('text(a NUL anywhere) => refused naming the field', () => {
    for (const value of ['\u0000', 'a\u0000b', 'ab\u0000']) expect(messages(notes.safeParse(value))).toEqual(["notes can't contain a NUL character"])
  })

  test('text(half of a surrogate pair, either half, or the halves reversed) => refused naming the field', () => {
    const broken = "notes can't contain half of a UTF-16 surrogate pair (a broken character)"
    for (const value of ['\ud83c', 'x\udf21', '\udf21\ud83c', 'end \ud800']) expect(messages(notes.safeParse(value))).toEqual([broken])
  })

  test('text(longer than max) => one message with the limit, without scanning it further', () => {
    expect(messages(notes.safeParse('x'.repeat(11)))).toEqual(['notes can be at most 10 characters'])
    // the length check aborts: a NUL after it is not reported as well
    expect(messages(notes.safeParse(`${'x'.repeat(20)}\u0000`))).toEqual(['notes can be at most 10 characters'])
    expect(notes.parse('x'.repeat(10))).toHaveLength(10)
  })

  test('text({ required, trim }) => white space trimmed first, then an empty text refused', () => {
    expect(title.parse('  Rising  ')).toBe('Rising')
    expect(title.parse(`   ${'x'.repeat(10)}   `)).toHaveLength(10)
    expect(messages(title.safeParse('   '))).toEqual(['title must not be empty'])
    expect(messages(text({ label: 'password', max: 5, required: 'Enter your password' }).safeParse(''))).toEqual(['Enter your password'])
  })

  test('text(not a string) => refused, never thrown', () => {
    for (const value of [null, 42, ['a'], { toString: 'x' }]) expect(notes.safeParse(value).success).toBe(false)
  })
})

describe('webAddress()', () => {
  const link = webAddress('link')

  test("webAddress(an http(s) address, or '') => kept as sent", () => {
    for (const value of ['https://example.com/puzzles/7?from=feed', 'http://example.com', '']) expect(link.parse(value)).toBe(value)
  })

  test('webAddress(an address that runs code, or no address) => refused', () => {
    for (const value of ['javascript:alert(1)', 'data:text/html,<b>x</b>', 'example.com', 'https://']) {
      expect(link.safeParse(value).success, value).toBe(false)
    }
  })

  test('webAddress(NUL or a lone surrogate in the path, which the URL parser lets through) => refused', () => {
    expect(messages(link.safeParse('https://example.com/a\u0000b'))).toContain("link can't contain a NUL character")
    expect(messages(link.safeParse('https://example.com/\ud800'))).toContain("link can't contain half of a UTF-16 surrogate pair (a broken character)")
  })

  test('webAddress(longer than 2000 characters) => refused', () => {
    expect(link.safeParse(`https://example.com/${'a'.repeat(1980)}`).success).toBe(true)
    expect(link.safeParse(`https://example.com/${'a'.repeat(2000)}`).success).toBe(false)
  })
})
