import { describe, expect, it } from 'vitest'
import { wordList } from '../../shared/words'

describe('wordList', () => {
  it('joins words as a sentence lists them, with no comma before the last', () => {
    expect(wordList([])).toBe('')
    expect(wordList(['Rock'])).toBe('Rock')
    expect(wordList(['Dawn', 'midday'])).toBe('Dawn and midday')
    expect(wordList(['clear', 'stained', 'muddy'], 'or')).toBe('clear, stained or muddy')
  })
})
