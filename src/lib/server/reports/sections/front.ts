/** Cover page and the owner's summary. */
import { RISK_WORDS, referenceSurvey, type AssessedSource } from '$lib/server/risk';
import { CAUTION_TEXT, CAUTION_TITLE } from '../caution';
import type { ReportWriter } from '../layout';
import { dateOnly, pct } from '../text';

export function coverPage(w: ReportWriter, source: AssessedSource, generatedAt: string): void {
	const { snapshot, header } = source;
	const survey = referenceSurvey(snapshot);
	w.doc.moveDown(4);
	w.paragraph('Fractile · concrete cover assessment report', { size: 11 });
	w.paragraph(snapshot.asset.name, { size: 24, bold: true });
	w.paragraph(header.title, { size: 13 });
	w.doc.moveDown(1);
	w.keyValues([
		[
			'Asset',
			`${snapshot.asset.name}${snapshot.asset.locationText ? `, ${snapshot.asset.locationText}` : ''}`
		],
		['Survey', survey ? `${survey.title} (${survey.surveyDate})` : 'All surveys of the asset'],
		['Assessment', `No. ${header.id}, ${header.state}`],
		['Engineer', header.approvedBy ?? header.createdBy ?? '–'],
		['Approved', dateOnly(header.approvedAt)],
		['Figures computed', dateOnly(snapshot.computedAt)],
		['Design service life', `${snapshot.asset.designServiceLifeYears} years`],
		['Snapshot checksum', `sha256 ${header.snapshotSha256.slice(0, 16)}…`]
	]);
	w.doc.moveDown(1);
	w.paragraph(`${CAUTION_TITLE} ${CAUTION_TEXT}`, { size: 9 });
	w.paragraph(`Generated ${generatedAt}`, { size: 8 });
}

export function ownerSummary(w: ReportWriter, source: AssessedSource): void {
	const { risk, annex, header } = source;
	w.doc.addPage();
	w.heading('Summary for the owner');
	w.paragraph(`Overall: ${risk.words}. ${risk.reason}`, { bold: true });
	w.keyValues([
		['Readings below minimum cover', pct(risk.shareBelowCMin)],
		[
			'Projected share depassivated at design life',
			source.projected
				? pct(risk.shareDepassivatedAtDesignLife)
				: 'Not projected: no durability parameters were entered.'
		],
		[
			'Area at this level',
			risk.areaAtLevelM2 === null
				? 'unknown'
				: `about ${risk.areaAtLevelM2.toFixed(0)} m² (scanned grid extent)`
		]
	]);
	w.table(
		[
			{ title: 'Part of the structure', width: 0.3 },
			{ title: 'Level', width: 0.16 },
			{ title: 'Why', width: 0.54 }
		],
		annex.populations.map((p) => [p.label, RISK_WORDS[p.level], p.reason])
	);
	w.heading("Engineer's recommendations", 2);
	w.paragraph(
		header.recommendations ?? 'The engineer gave no recommendations with this assessment.'
	);
}
