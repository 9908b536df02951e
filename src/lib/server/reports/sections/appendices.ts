/** Appendices: readings summary per member and the verification holes. */
import type { AssessedSource } from '$lib/server/risk';
import type { ReportWriter } from '../layout';
import { mm } from '$lib/format';

export function appendices(w: ReportWriter, source: AssessedSource): void {
	const { annex, snapshot } = source;
	w.doc.addPage();
	w.heading('Appendix A: readings summary per member');
	const labels = new Map(
		snapshot.populations.flatMap((p) => p.members.map((m) => [m.id, m.label]))
	);
	if (annex.members.length === 0) {
		w.table(
			[
				{ title: 'Member', width: 0.4 },
				{ title: 'Population', width: 0.4 },
				{ title: 'Readings', width: 0.2, align: 'right' }
			],
			snapshot.populations.flatMap((p) =>
				p.members.map((m) => [m.label, p.label, String(m.readings)])
			)
		);
	} else {
		w.table(
			[
				{ title: 'Member', width: 0.2 },
				{ title: 'Face', width: 0.1 },
				{ title: 'n', width: 0.1, align: 'right' },
				{ title: 'Mean', width: 0.14, align: 'right' },
				{ title: 'Min', width: 0.14, align: 'right' },
				{ title: 'Max', width: 0.14, align: 'right' },
				{ title: 'Below c_min', width: 0.18, align: 'right' }
			],
			annex.members.map((m) => [
				m.label,
				m.face,
				String(m.n),
				mm(m.meanMm),
				mm(m.minMm),
				mm(m.maxMm),
				String(m.belowCMin)
			])
		);
	}
	w.heading('Appendix B: verification holes');
	const holes = snapshot.meter.holes;
	if (holes.length === 0) {
		w.paragraph('No verification holes were recorded.');
		return;
	}
	w.table(
		[
			{ title: 'Member', width: 0.2 },
			{ title: 'Hole', width: 0.15 },
			{ title: 'Meter reading', width: 0.2, align: 'right' },
			{ title: 'Measured', width: 0.2, align: 'right' },
			{ title: 'Method', width: 0.25 }
		],
		holes.map((h) => [
			labels.get(h.memberId) ?? String(h.memberId),
			h.label,
			mm(h.meterReadingMm),
			mm(h.measuredCoverMm),
			h.method ?? '–'
		])
	);
}
