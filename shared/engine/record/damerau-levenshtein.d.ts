// The package ships no types; this is the part Cyclodial uses.
declare module 'damerau-levenshtein' {
  interface DamerauLevenshteinResult {
    steps: number
    relative: number
    similarity: number
  }
  function damerauLevenshtein(a: string, b: string, limit?: number): DamerauLevenshteinResult
  export default damerauLevenshtein
}
