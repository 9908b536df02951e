/**
 * The site sheet of a survey plan: per member a grid of blank cells to write cover readings in
 * by hand, numbered, as many as the plan asks of the member, with the member's figures above it.
 * pdfkit in the reports' typeface (reports/fonts.ts), which prints Δ, ≥ and Ø.
 */
import { mm } from '$lib/format';
import PDFDocument from 'pdfkit';
import { registerReportFonts } from '../reports/fonts';
import { MARGIN, ReportWriter } from '../reports/layout';
import { pdfText } from '../reports/text';
import { StateError } from '../domainErrors';
import { Asset, Member } from '../db/models';
import type { Actor } from '../policy';
import { scopedSurvey } from '../access';
import { surveyPlanOf, type SurveyPlanView } from './service';

const COLUMNS = 10;
const CELL_HEIGHT = 24;
/** Cells printed for a member whose population the plan does not cover. */
const UNPLANNED_CELLS = 10;

interface SheetMember {
	label: string;
	memberType: string;
	exposureClass: string;
	cMinMm: number;
	cNomMm: number;
	planned: number | null;
}

function header(w: ReportWriter, title: string, lines: string[]) {
	w.doc.font('Body-Bold').fontSize(15).fillColor('#111111');
	w.doc.text(pdfText(title), MARGIN, MARGIN, { width: w.width });
	w.doc.moveDown(0.3);
	for (const line of lines) w.paragraph(line, { size: 9 });
}

function memberBlock(w: ReportWriter, m: SheetMember) {
	const cells = m.planned ?? UNPLANNED_CELLS;
	const rows = Math.ceil(cells / COLUMNS);
	const doc = w.doc;
	w.ensureSpace(44 + rows * CELL_HEIGHT + 26);
	doc.moveDown(0.6);
	doc.font('Body-Bold').fontSize(11).fillColor('#111111');
	doc.text(pdfText(`Member ${m.label}`), MARGIN, doc.y, { width: w.width });
	const plannedWords =
		m.planned === null
			? `not in the plan: ${UNPLANNED_CELLS} cells printed`
			: `planned readings ${m.planned}`;
	doc.font('Body').fontSize(9).fillColor('#333333');
	doc.text(
		pdfText(
			`${m.memberType} · ${m.exposureClass} · c_min ${m.cMinMm} mm · c_nom ${m.cNomMm} mm · ${plannedWords}`
		),
		MARGIN,
		doc.y + 1,
		{ width: w.width }
	);
	const top = doc.y + 4;
	const cellWidth = w.width / COLUMNS;
	doc.lineWidth(0.6).strokeColor('#777777');
	for (let i = 0; i < cells; i++) {
		const x = MARGIN + (i % COLUMNS) * cellWidth;
		const y = top + Math.floor(i / COLUMNS) * CELL_HEIGHT;
		doc.rect(x, y, cellWidth, CELL_HEIGHT).stroke();
		doc.font('Body').fontSize(6).fillColor('#888888');
		doc.text(String(i + 1), x + 2, y + 2, { width: cellWidth - 4, lineBreak: false });
	}
	const after = top + rows * CELL_HEIGHT + 5;
	doc.font('Body').fontSize(8).fillColor('#333333');
	doc.text(
		pdfText(
			'Cover (mm) in each cell · bar Ø estimate: ________ · counted: ______ · initials: ______'
		),
		MARGIN,
		after,
		{ width: w.width }
	);
}

function summaryLines(plan: SurveyPlanView): string[] {
	return plan.result.map(
		(p) =>
			`${p.memberType} × ${p.exposureClass}: ${p.totalReadings} readings = ${p.memberCount} member${p.memberCount === 1 ? '' : 's'} × ${p.readingsPerMember} (governed by ${p.governing.criterion}; expected SD ${mm(p.sdMm)}, ${p.sdBasis})`
	);
}

/** The site sheet as PDF bytes; a survey without a saved plan has none (StateError). */
export async function siteSheetPdf(actor: Actor, surveyId: number): Promise<Buffer> {
	const { survey } = await scopedSurvey(actor, surveyId, 'read');
	const plan = await surveyPlanOf(actor, surveyId);
	if (!plan)
		throw new StateError('The survey has no plan yet: save a plan to print its site sheet.');
	const asset = await Asset.findByPk(survey.assetId);
	const members = await Member.findAll({ where: { surveyId }, order: [['label', 'ASC']] });
	const planned = new Map(plan.members.map((m) => [m.memberId, m.planned]));
	const when = new Date(plan.updatedAt);
	const doc = new PDFDocument({
		size: 'A4',
		margin: MARGIN,
		info: {
			Title: pdfText(`Site sheet: ${survey.title}`),
			Subject: 'Cover survey site sheet',
			Creator: 'Fractile',
			Producer: 'Fractile (pdfkit)',
			CreationDate: when,
			ModDate: when
		}
	});
	const chunks: Buffer[] = [];
	doc.on('data', (c: Buffer) => chunks.push(c));
	const done = new Promise<Buffer>((resolve, reject) => {
		doc.on('end', () => resolve(Buffer.concat(chunks)));
		doc.on('error', reject);
	});
	registerReportFonts(doc);
	const w = new ReportWriter(doc);
	header(w, `Site sheet: ${survey.title}`, [
		`Asset ${asset?.name ?? '–'} · survey date ${survey.surveyDate} · meter ${survey.meterMake ?? '________'} ${survey.meterSerial ?? ''}`,
		'Calibrate the meter away from steel. Read each bar where the reading is least and write the cover in the next cell.',
		...summaryLines(plan)
	]);
	for (const m of members) {
		memberBlock(w, {
			label: m.label,
			memberType: m.memberType,
			exposureClass: m.exposureClass,
			cMinMm: m.cMinMm,
			cNomMm: m.cNomMm,
			planned: planned.get(m.id) ?? null
		});
	}
	doc.end();
	return done;
}
