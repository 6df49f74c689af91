// The casebook as the staff pages load it (engine templates, the tutor's own
// templates and exact cases, default tolerance and weights).

export function useCasebook(archived: Ref<'0' | '1'> = ref('0'), page: Ref<number> = ref(1)) {
  return useFetch('/api/casebook', { key: 'casebook', query: { archived, page } })
}

/** What a template's torsion range measures, in words. */
export const TORSION_OF_WORDS: Record<string, string> = {
  'each-eye': 'each eye',
  'affected-eye': 'the affected eye',
  'total': 'both eyes together',
  'objective-affected-eye': 'the affected eye (objective)',
  'hyper-and-hypo-eye': 'each eye (size)',
}
