export interface UsedWords {
  words: Set<string>
  prefixes: Set<string>
}
export interface UsedClasses extends UsedWords {
  srcWords: Set<string>
  propPrefixes: Set<string>
}
export function wordsOf(texts: string[]): UsedWords
export function usedWords(root: string): UsedClasses
export function trimCss(css: string, used: UsedClasses): string
