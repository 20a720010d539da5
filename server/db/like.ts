/** `text` as a literal inside a LIKE/ILIKE pattern: backslash, % and _ escaped (PostgreSQL's default escape). */
export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, (c) => `\\${c}`)
}
