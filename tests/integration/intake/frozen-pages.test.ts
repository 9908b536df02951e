/**
 * Frozen and empty surveys explained where they bite (over HTTP, the built app, the real
 * database): the survey page, the member's entry page and the member edit page say why nothing
 * can be changed and what would unfreeze it, named for the reader's role.
 */
import { describe, expect, it } from 'vitest';
import { asDemoSurveyor, editableRecords, submitSurvey } from '../../helpers/editing';
import { signInAs } from '../../helpers/session';

/** The text of the element marked `data-testid="<id>"` (a notice), '' when absent. */
function notice(html: string, id: string): string {
	const match = html.match(new RegExp(`data-testid="${id}"[^>]*>([\\s\\S]*?)</div>`));
	return (match?.[1] ?? '')
		.replace(/<[^>]+>/g, '')
		.replace(/\s+/g, ' ')
		.trim();
}

const SURVEYOR_WAY = 'ask an engineer of your organisation to return the survey for changes';
const ENGINEER_WAY = 'return the survey to the surveyor with "Return to surveyor"';

describe('a submitted survey', () => {
	const session = asDemoSurveyor();

	it('says on its page why nothing can be entered, and names the way back per role', async () => {
		const { survey } = await editableRecords(session.actor);
		await submitSurvey(session.surveyor, survey.id);
		const engineer = await signInAs('engineer');
		const asSurveyor = await (await session.surveyor.get(`/surveys/${survey.id}`)).text();
		expect(notice(asSurveyor, 'frozen-notice')).toContain('its readings are frozen');
		expect(notice(asSurveyor, 'frozen-notice')).toContain(SURVEYOR_WAY);
		// No link promises entry that the page behind it will not offer.
		expect(asSurveyor).not.toContain('Enter readings, holes');
		expect(asSurveyor).toContain('Readings and holes');
		const asEngineer = await (await engineer.get(`/surveys/${survey.id}`)).text();
		expect(notice(asEngineer, 'frozen-notice')).toContain(ENGINEER_WAY);
	});

	it('explains on the entry page why there is no grid', async () => {
		const { survey, member } = await editableRecords(session.actor);
		const before = await (await session.surveyor.get(`/members/${member.id}/entry`)).text();
		expect(notice(before, 'frozen-notice')).toBe('');
		await submitSurvey(session.surveyor, survey.id);
		const after = await (await session.surveyor.get(`/members/${member.id}/entry`)).text();
		expect(after).not.toContain('Enter readings</h2>');
		expect(notice(after, 'frozen-notice')).toContain('its readings are frozen');
		expect(notice(after, 'frozen-notice')).toContain(SURVEYOR_WAY);
	});

	it('shows a member’s values read-only, with no save or suggestion offered', async () => {
		const { survey, member } = await editableRecords(session.actor);
		const open = await (await session.surveyor.get(`/members/${member.id}/edit`)).text();
		expect(open).toContain('Save member');
		await submitSurvey(session.surveyor, survey.id);
		const frozen = await (await session.surveyor.get(`/members/${member.id}/edit`)).text();
		expect(frozen).toMatch(/<fieldset[^>]* disabled[^>]*data-read-only="true"/);
		expect(frozen).not.toContain('Save member');
		expect(frozen).not.toContain('Suggest c_min');
		expect(frozen).toContain(SURVEYOR_WAY);
		// Information in amber, not an error in red.
		expect(frozen).not.toMatch(/role="alert"[^>]*>\s*The survey is submitted/);
	});
});

describe('an empty survey', () => {
	const session = asDemoSurveyor();

	it('does not offer "Submit for review", and says what it needs first', async () => {
		const { survey } = await editableRecords(session.actor);
		const page = await (await session.surveyor.get(`/surveys/${survey.id}`)).text();
		expect(page).not.toContain('Submit for review');
		expect(notice(page, 'empty-notice')).toBe(
			'The survey has no readings yet: enter or import readings before submitting it for review.'
		);
		const refused = await session.surveyor.postForm(`/surveys/${survey.id}?/submit`);
		expect(refused.status).toBe(409);
		expect(await refused.text()).toContain('The survey has no readings yet');
	});
});
