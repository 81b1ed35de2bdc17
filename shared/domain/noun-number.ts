/** Words ending in a plural-looking s that name one thing or a mass ("molasses comes out"). */
const SINGULAR_ENDING_IN_S = new Set(['molasses', 'gas', 'lens', 'news']);

/**
 * Whether a thing's name is plural, by its last word: "French oak cubes" is, "oak spiral",
 * "vanilla bean", "hibiscus" and "glass" are not. English regular plurals (an s after a letter
 * other than s, i or u), with the usual exceptions.
 * @param name - what was added, as the maker wrote it
 */
export function isPluralName(name: string): boolean {
  const last = (name.toLowerCase().match(/[a-z]+(?=[^a-z]*$)/) ?? [''])[0];
  return !SINGULAR_ENDING_IN_S.has(last) && /[^siu]s$/.test(last);
}

/**
 * "French oak cubes come out of Ash melomel", "Oak spiral comes out of Ash melomel".
 * @param name - what comes out
 * @param batchName - what it comes out of
 */
export function comesOutOf(name: string, batchName: string): string {
  return `${name} ${isPluralName(name) ? 'come' : 'comes'} out of ${batchName}`;
}
