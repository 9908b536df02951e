import { appLink } from './config';

/** The words of each mail the accounts part sends; plain text, since every client shows it. */
export function invitationMail(input: {
	organisationName: string;
	inviterName: string;
	role: string;
	secret: string;
}) {
	const link = appLink(`/invitations/${input.secret}`);
	return {
		subject: `You are invited to ${input.organisationName} on Fractile`,
		text: [
			`${input.inviterName} has invited you to join ${input.organisationName} on Fractile as ${input.role}.`,
			'',
			`Accept the invitation here (the link works once, for 7 days):`,
			link,
			'',
			'If you did not expect this, you can ignore this message.'
		].join('\n')
	};
}

export function passwordResetMail(input: { displayName: string; secret: string }) {
	const link = appLink(`/reset-password/${input.secret}`);
	return {
		subject: 'Choose a new Fractile password',
		text: [
			`Hello ${input.displayName},`,
			'',
			'Someone (we hope you) asked to reset the password of your Fractile account.',
			'Choose a new one here (the link works once, for 1 hour):',
			link,
			'',
			'If you did not ask for this, ignore this message: your password stays as it is.'
		].join('\n')
	};
}
