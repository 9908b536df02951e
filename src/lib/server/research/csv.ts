/**
 * CSV writing for research exports: the app's one CSV writer with its formula-injection guard
 * (src/lib/csv.ts), re-exported under the name the research modules import.
 */
export { csvCell, csvLine } from '$lib/csv';
