/**
 * Caption files as video platforms and editors write them. Syntax from the WebVTT spec (W3C, "WebVTT: The Web
 * Video Text Tracks Format", sections named beside each check); SRT has no published standard, its layout
 * (counter, "hh:mm:ss,mmm --> hh:mm:ss,mmm", text, blank line) is common practice.
 */
import { describe, expect, test } from 'vitest'
import { captionWords, CaptionFileError } from '../../../server/captions/caption-words'

const words = (fileText: string) => captionWords(fileText).map((w) => w.word)

describe('captionWords', () => {
  test('WebVTT with a BOM and CRLF line ends (W3C WebVTT §4.1: optional U+FEFF, any of CRLF/LF/CR) => its words', () => {
    const file = '\uFEFFWEBVTT\r\n\r\n00:00:01.000 --> 00:00:02.000\r\nHello there\r\n\r\n00:00:02.000 --> 00:00:03.000\r\nand welcome\r\n'
    expect(captionWords(file)).toEqual([
      { word: 'Hello', startMs: 1000, endMs: 1455 },
      { word: 'there', startMs: 1545, endMs: 2000 },
      { word: 'and', startMs: 2000, endMs: 2273 },
      { word: 'welcome', startMs: 2364, endMs: 3000 },
    ])
  })

  test('words in a cue are timed by character offset across the cue', () => {
    const [a, b] = captionWords('WEBVTT\n\n00:00:10.000 --> 00:00:14.000\naaa bbbbbbb\n')
    // 11 characters over 4 s: "bbbbbbb" starts at character 4
    expect(a.startMs).toBe(10_000)
    expect(b.startMs).toBe(10_000 + Math.round((4 * 4000) / 11))
    expect(b.endMs).toBe(14_000)
  })

  test('styling tags <c>, <i>, <b>, <u>, <v Name> and <lang> (W3C WebVTT §4.2.2 cue text spans) => only the spoken text', () => {
    const file = 'WEBVTT\n\n00:00:01.000 --> 00:00:04.000\n<v Ana Ribeiro>Look at <i>row</i> <b>three</b>, <c.loud>column</c> <u>four</u> <lang en>now</lang></v>\n'
    expect(words(file)).toEqual(['Look', 'at', 'row', 'three,', 'column', 'four', 'now'])
  })

  test('cue settings and a cue identifier (W3C WebVTT §4.1 cue blocks, §4.4 cue settings) => not words', () => {
    const file = 'WEBVTT\n\nintro-1\n00:00:01.000 --> 00:00:02.000 position:10% align:start line:0 size:50%\nFirst words\n'
    expect(words(file)).toEqual(['First', 'words'])
  })

  test('NOTE and STYLE blocks (W3C WebVTT §4.1: comment and style blocks) => ignored', () => {
    const file = [
      'WEBVTT - captions for a test',
      '',
      'STYLE',
      '::cue { color: yellow }',
      '',
      'NOTE written by hand,',
      'over two lines',
      '',
      '00:00:01.000 --> 00:00:02.000',
      'Spoken text',
      '',
      'NOTE one more',
      '',
    ].join('\n')
    expect(words(file)).toEqual(['Spoken', 'text'])
  })

  test('inline timestamps (W3C WebVTT §4.2.2 cue timestamp) => each word from its own timestamp', () => {
    const file = 'WEBVTT\n\n00:00:05.000 --> 00:00:08.000\nthe<00:00:05.400><c> bulb</c><00:00:06.900><c> is</c>\n'
    expect(captionWords(file).map((w) => [w.word, w.startMs])).toEqual([['the', 5000], ['bulb', 5400], ['is', 6900]])
  })

  test('character references (W3C WebVTT §4.2.2, HTML named references) => decoded', () => {
    expect(words('WEBVTT\n\n00:00:01.000 --> 00:00:02.000\nrows &amp; columns\n')).toEqual(['rows', '&', 'columns'])
  })

  test('rolling automatic captions (each cue repeats the line before) => every word once, new words timed from their cue', () => {
    const file = [
      'WEBVTT',
      '',
      '00:00:01.000 --> 00:00:03.000',
      'there is just one home',
      '',
      '00:00:03.000 --> 00:00:05.000',
      'there is just one home',
      'for a three in this box',
      '',
      '00:00:05.000 --> 00:00:07.000',
      'for a three in this box',
      'at row three column five',
    ].join('\n')
    const got = captionWords(file)
    expect(got.map((w) => w.word).join(' ')).toBe('there is just one home for a three in this box at row three column five')
    expect(got.find((w) => w.word === 'for')!.startMs).toBe(3000)
    expect(got.find((w) => w.word === 'at')!.startMs).toBe(5000)
  })

  test('overlapping cues that repeat the same text => said once', () => {
    const file = 'WEBVTT\n\n00:00:01.000 --> 00:00:03.000\nfive cells\n\n00:00:02.500 --> 00:00:04.000\nfive cells\n\n00:00:04.000 --> 00:00:05.000\nfive cells again\n'
    // the third cue doesn't overlap, but repeats two words: a rolling repeat as well
    expect(words(file)).toEqual(['five', 'cells', 'again'])
  })

  test('a word said twice across cues that neither overlap nor roll => kept twice', () => {
    expect(words('WEBVTT\n\n00:00:01.000 --> 00:00:02.000\nit is a nine\n\n00:00:03.000 --> 00:00:04.000\nnine\n')).toEqual(['it', 'is', 'a', 'nine', 'nine'])
  })

  test('cues out of order in the file => words in time order', () => {
    expect(words('WEBVTT\n\n00:00:05.000 --> 00:00:06.000\nsecond\n\n00:00:01.000 --> 00:00:02.000\nfirst\n')).toEqual(['first', 'second'])
  })

  test('SRT with CRLF, a BOM, <i>/<font> tags and {\\an8} position codes (common practice) => its words and times', () => {
    const file = '\uFEFF1\r\n00:00:01,000 --> 00:00:02,000\r\n<i>Hello</i> <font color="#fff">there</font>\r\n\r\n2\r\n00:01:02,500 --> 00:01:03,500\r\n{\\an8}top line\r\n'
    expect(captionWords(file).map((w) => [w.word, w.startMs])).toEqual([['Hello', 1000], ['there', 1545], ['top', 62_500], ['line', 63_000]])
  })

  test('SRT with rolling repeats => de-duplicated like WebVTT', () => {
    const file = '1\n00:00:01,000 --> 00:00:02,000\nthe bulb is low\n\n2\n00:00:02,000 --> 00:00:03,000\nthe bulb is low\nand the tip is high\n'
    expect(words(file).join(' ')).toBe('the bulb is low and the tip is high')
  })

  test.each([
    ['plain text', 'Just some notes about the puzzle.\nNothing timed here.'],
    ['an empty file', ''],
    ['JSON', '{"cues": []}'],
    ['WEBVTT without a separator (W3C WebVTT §4.1: the signature is followed by a space, tab or line end)', 'WEBVTTX\n\n00:00:01.000 --> 00:00:02.000\nhi\n'],
  ])('%s => CaptionFileError saying it is not a caption file', (_, text) => {
    expect(() => captionWords(text)).toThrow(CaptionFileError)
    expect(() => captionWords(text)).toThrow(/^This isn't a WebVTT or SRT caption file: it starts with/)
  })

  test('a WebVTT file with no cues => CaptionFileError saying there is nothing to match', () => {
    expect(() => captionWords('WEBVTT\n\nNOTE nothing yet\n')).toThrow(/no cues with text/)
  })
})
