/** Cover page and the owner's summary. */
import { referenceSurvey, toRiskView, type AssessedSource } from '$lib/server/risk';
import { CAUTION_TEXT, CAUTION_TITLE } from '../caution';
import type { ReportWriter } from '../layout';
import { DEPASSIVATED_WORDS, surveyStateWords } from '$lib/words';
import { formatDate, formatDateTime, percent } from '$lib/format';

/** Each survey whose readings are in the figures, with its state when the figures were taken. */
function surveyLines(source: AssessedSource): string {
	const { surveys } = source.snapshot;
	if (surveys.length === 0) return 'none';
	return surveys
		.map((s) => `${s.title} (${s.surveyDate}; ${surveyStateWords(s.status)})`)
		.join('\n');
}

/** Who prepared and who approved the assessment, for whom, and when: the report's signatory. */
function signatoryBlock(w: ReportWriter, source: AssessedSource): void {
	const { header } = source;
	w.heading('Signatory', 2);
	w.keyValues([
		['Organisation', header.organisation ?? '–'],
		['Prepared by', header.createdBy ?? '–'],
		['Approved by', header.approvedBy ?? 'not approved'],
		['Approved on', formatDate(header.approvedAt, '–')]
	]);
}

export function coverPage(w: ReportWriter, source: AssessedSource, generatedAt: string): void {
	const { snapshot, header } = source;
	const survey = referenceSurvey(snapshot);
	w.doc.moveDown(3);
	w.paragraph('Fractile · concrete cover assessment report', { size: 11 });
	w.paragraph(snapshot.asset.name, { size: 24, bold: true });
	w.paragraph(header.title, { size: 13 });
	w.doc.moveDown(1);
	w.keyValues([
		[
			'Asset',
			`${snapshot.asset.name}${snapshot.asset.locationText ? `, ${snapshot.asset.locationText}` : ''}`
		],
		[snapshot.surveys.length === 1 ? 'Survey' : 'Surveys', surveyLines(source)],
		['Age taken from', survey ? `${survey.title} (${survey.surveyDate})` : '–'],
		['Assessment', `No. ${header.id}, ${header.state}`],
		['Figures computed', formatDate(snapshot.computedAt, '–')],
		['Design service life', `${snapshot.asset.designServiceLifeYears} years`],
		['Snapshot checksum', `sha256 ${header.snapshotSha256.slice(0, 16)}…`]
	]);
	signatoryBlock(w, source);
	w.doc.moveDown(0.5);
	w.paragraph(`${CAUTION_TITLE} ${CAUTION_TEXT}`, { size: 9 });
	w.paragraph(`Generated ${formatDateTime(generatedAt)}`, { size: 8 });
}

export function ownerSummary(w: ReportWriter, source: AssessedSource): void {
	const { risk, header } = source;
	const view = toRiskView(source);
	w.doc.addPage();
	w.heading('Summary for the owner');
	w.paragraph(`Overall: ${risk.words}. ${risk.reason}`, { bold: true });
	w.keyValues([
		['Readings below minimum cover', percent(risk.shareBelowCMin)],
		[
			'Projected share without protection at design life',
			source.projected
				? percent(risk.shareDepassivatedAtDesignLife)
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
		view.populations.map((p) => [
			p.label,
			p.words,
			[p.reason, p.explanation, p.indicative].filter(Boolean).join(' ')
		])
	);
	w.paragraph(DEPASSIVATED_WORDS, { size: 9 });
	w.heading("Engineer's recommendations", 2);
	w.paragraph(
		header.recommendations ?? 'The engineer gave no recommendations with this assessment.'
	);
}
