/** The populations the engineer made and the assessment carries, in the owner's words. */
import type { AssessedSource } from '$lib/server/risk';
import { CUSTOM_APART_WORDS, customPopulationWords } from '$lib/words';
import type { ReportWriter } from '../layout';

export function customSection(w: ReportWriter, source: AssessedSource): void {
	const carried = source.snapshot.custom ?? [];
	if (carried.length === 0) return;
	w.heading('Members the engineer judged apart', 2);
	for (const c of carried) w.paragraph(customPopulationWords(c));
	w.paragraph(CUSTOM_APART_WORDS, { size: 8 });
}
