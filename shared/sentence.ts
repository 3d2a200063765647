/**
 * The first letter of a sentence in capitals, unless the sentence opens with a
 * symbol of the trade, whose case is its meaning: σ'p, σ'v0, γ, e0, cv, Cα, su,
 * qnet, k. A sentence is capitalised only when its first word is a plain word:
 * Latin letters alone, three or more of them (or "a"/"an"), with no prime, digit
 * or Greek letter in it.
 */
export function startSentence(text: string): string {
  const first = (/^\S*/.exec(text)?.[0] ?? '').replace(/[,.;:]$/, '')
  const plainWord = /^(?:[a-z][a-zA-Z]{2,}|an?)$/.test(first)
  return plainWord ? text.charAt(0).toUpperCase() + text.slice(1) : text
}
