import { execFileSync } from 'node:child_process';
import { mkdirSync, statSync, writeFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import type { Assessment } from '../../src/lib/server/db/models';
import { testSequelize } from '../helpers/database';
import { approvedCarParkAssessment, strangerOwner } from '../helpers/assessments';
import { signIn, signInAs } from '../helpers/session';
import { overlappingLines, textLines } from '../helpers/pdfLayout';

const OUT = 'test-results';

async function download(path: string, client: { get(p: string): Promise<Response> }, name: string) {
	const response = await client.get(path);
	expect(response.status).toBe(200);
	expect(response.headers.get('content-type')).toBe('application/pdf');
	const file = `${OUT}/${name}`;
	writeFileSync(file, Buffer.from(await response.arrayBuffer()));
	return file;
}

const text = (file: string) =>
	execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
const withoutTimestamp = (t: string) =>
	t
		.split('\n')
		.filter((line) => !/^\s*Generated \d{4}-/.test(line))
		.join('\n');

describe('the report PDF of the demo car-park assessment', () => {
	let sequelize: Sequelize;
	let assessment: Assessment;
	let first: string;

	beforeAll(async () => {
		mkdirSync(`${OUT}/screenshots`, { recursive: true });
		sequelize = testSequelize();
		assessment = await approvedCarParkAssessment(sequelize, await signInAs('engineer'));
		first = await download(
			`/api/v1/assessments/${assessment.id}/report`,
			await signInAs('owner'),
			'report-1.pdf'
		);
	});
	afterAll(async () => {
		await sequelize.close();
	});

	it('holds the populations, their verdicts, the risk levels, the caution and page numbers', () => {
		const t = text(first);
		for (const words of [
			'Brackenfield Multi-storey Car Park',
			'deck · XD3',
			'slab · XC3',
			'column · XD3'
		]) {
			expect(t).toContain(words);
		}
		expect(t).toMatch(/Verdict: (Does not comply|Complies|Too few readings)/);
		expect(t).toContain('Act now');
		expect(t).toContain('Decision support, not a decision.');
		expect(t).toContain('licensed engineer decide');
		expect(t).toContain('Method statement');
		expect(t).toContain('Appendix B: verification holes');
		expect(t).toMatch(/Page 1 of \d+/);
		expect(t).toContain('Break out and test chloride profiles');
	});

	it('gives the same text every time apart from the generation timestamp', async () => {
		const second = await download(
			`/api/v1/assessments/${assessment.id}/report`,
			await signInAs('engineer'),
			'report-2.pdf'
		);
		const [a, b] = [text(first), text(second)];
		expect(a).toMatch(/Generated \d{4}-/);
		expect(withoutTimestamp(a)).toBe(withoutTimestamp(b));
		const info = execFileSync('pdfinfo', [first], {
			encoding: 'utf8',
			env: { ...process.env, TZ: 'UTC' }
		});
		expect(info).toMatch(/CreationDate:\s+Fri Jan 16 10:00:00 2026/);
	});

	it('prints no line of text over another on any page (pdftotext -bbox-layout)', () => {
		const lines = textLines(first);
		expect(lines.length).toBeGreaterThan(100);
		const clashes = overlappingLines(lines).map(
			([a, b]) => `page ${a.page}: “${a.text}” over “${b.text}”`
		);
		expect(clashes).toEqual([]);
	});

	it('prints mathematical signs as signs, not spelt out or as question marks', () => {
		const t = text(first);
		expect(t).toContain('k·√t');
		expect(t).toContain('Φ⁻¹');
		expect(t).toContain('β');
		expect(t).not.toMatch(/sqrt|Phi\?|\?¹/);
	});

	it('prints what the projections rest on, each input measured, fitted or assumed', () => {
		const t = text(first);
		expect(t).toContain('What the projections rest on');
		const table = t.slice(t.indexOf('What the projections rest on'));
		for (const words of ['Apparent diffusion', 'fitted', 'measured', 'assumed', 'Default:'])
			expect(table).toContain(words);
		// The deck's inputs are fitted to its six profiles; the slab's are assumed, so indicative.
		expect(table).toMatch(/Mean of 6 fitted\s+profiles/);
		expect(t).toContain('Indicative: assumed, not measured. Measure carbonation depths');
	});

	it('draws each chloride profile with its fit, and the band of a measured projection', () => {
		const t = text(first);
		expect(t).toContain('Chloride profiles');
		for (const label of ['CP-01', 'CP-02', 'CP-03', 'CP-04', 'CP-05', 'CP-06', 'CP-07', 'CP-08'])
			expect(t).toMatch(new RegExp(`${label} \\(L2-[A-Z0-9-]+\\): C_s`));
		expect(t).toContain('is marked with a cross');
		expect(t).toMatch(/band \d+(\.\d)? %–\d+(\.\d)? %/);
		expect(t).toContain('cover is less than the depth the front has reached');
	});

	it('lists the surveys with their states and a signatory block', () => {
		const t = text(first);
		expect(t).toMatch(
			/Surveys?\s+.*\((\d{4}-\d{2}-\d{2}); (approved|submitted, not yet approved|draft)/
		);
		expect(t).toContain('Signatory');
		expect(t).toContain('Kestrel Lane Consulting');
		expect(t).toMatch(/Approved by\s+\S/);
		expect(t).toMatch(/Verdict: (Complies|Does not comply|Too few readings)/);
		expect(t).not.toMatch(/Verdict: (Pass|Fail)\b/);
	});

	it('renders page 1 to a PNG kept with the test results', () => {
		const prefix = `${OUT}/screenshots/report-page-1`;
		execFileSync('pdftoppm', [
			'-png',
			'-r',
			'80',
			'-f',
			'1',
			'-l',
			'1',
			'-singlefile',
			first,
			prefix
		]);
		expect(statSync(`${prefix}.png`).size).toBeGreaterThan(10_000);
	});

	it('shows another organisation’s owner nothing', async () => {
		const stranger = await strangerOwner(`report${Date.now()}`);
		const client = await signIn(stranger.email, stranger.password);
		expect((await client.get(`/api/v1/assessments/${assessment.id}/report`)).status).toBe(404);
	});
});
