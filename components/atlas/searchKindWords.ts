/** What a recorded exhaustive search looked for, by its stored kind (lib/discovery SearchKind
 * and the job kinds' own names), in words; an unknown kind is shown with spaces for hyphens. */
const SEARCH_KIND_WORDS: Record<string, string> = {
  projections: "projections of the cells",
  partitions: "partitions of the alphabet",
  congruences: "partitions of the alphabet",
  lumping: "coarsest lumping",
  "exact-lumping": "coarsest exact lumping",
  "coarsest-lumping": "coarsest lumping",
  "coarsest-exact-lumping": "coarsest exact lumping",
};

export function searchKindWords(kind: string): string {
  return SEARCH_KIND_WORDS[kind] ?? kind.replace(/-/g, " ");
}
