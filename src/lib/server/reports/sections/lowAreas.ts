/** Where to treat first: the low-cover areas kept in the snapshot (populations/lowAreas.ts). */
import { percent } from '$lib/format';
import type { AssessedSource } from '$lib/server/risk';
import { memberLowAreaWords, treatFirstWords } from '$lib/words';
import type { ReportWriter } from '../layout';
import { SMALL_AREA_M2 } from '$lib/populations/lowCoverAreas';

export function lowAreaSection(w: ReportWriter, source: AssessedSource): void {
	const populations = source.snapshot.lowAreas;
	if (!populations) return;
	const members = populations.flatMap((p) => p.members);
	w.heading('Areas of low cover', 2);
	w.paragraph(treatFirstWords(members) ?? 'No member has an area of map cells below its c_min.');
	if (members.length === 0) return;
	w.paragraph(
		'An area is a set of cover-map cells whose least reading is below the member’s c_min, joined ' +
			'through shared edges; its size is the cells’ area. Areas of a single cell or under ' +
			`${SMALL_AREA_M2} m² are counted together as small spots, as on the member’s map.`,
		{ size: 8 }
	);
	w.keyValues(
		[...members]
			.sort((a, b) => b.areaM2 - a.areaM2)
			.slice(0, 8)
			.map((m): [string, string] => [
				`${m.memberLabel} (${m.populationLabel})`,
				`${memberLowAreaWords(m)} (${percent(m.share)} of the member below c_min)`
			])
	);
}
