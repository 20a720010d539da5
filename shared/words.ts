/** Words as a list in a sentence: "a", "a and b", "a, b and c" (or with "or"); no comma before the last. */
export function wordList(words: string[], conjunction: 'and' | 'or' = 'and'): string {
  return words.length < 2
    ? (words[0] ?? '')
    : `${words.slice(0, -1).join(', ')} ${conjunction} ${words.at(-1)}`
}
