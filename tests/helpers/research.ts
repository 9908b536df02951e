import { demoAssets, demoOrganisations, demoPeople } from '../../seeds/scenario';

/**
 * Every identifying text of the demo scenario: asset names, locations and descriptions, survey
 * titles and notes, member labels, meter details, organisation names and people. Research
 * output must contain none of them.
 */
export function identifyingDemoTexts(): string[] {
	const texts = new Set<string>();
	for (const asset of demoAssets) {
		texts.add(asset.name);
		texts.add(asset.locationText);
		texts.add(asset.description);
		for (const survey of asset.surveys) {
			texts.add(survey.title);
			texts.add(survey.notes);
			texts.add(survey.meterSerial);
			texts.add(survey.meterMake);
			// Labels such as "L2-BAY-01" are free text a surveyor typed: they must not travel.
			for (const member of survey.members) texts.add(member.label);
		}
	}
	for (const org of demoOrganisations) texts.add(org.name);
	for (const person of demoPeople) {
		texts.add(person.displayName);
		texts.add(person.email);
	}
	// Parts of the names and places too, so a truncated or reworded copy is caught.
	for (const word of ['Brackenfield', 'Orchard Row', 'Millrace', '(invented)', 'Kestrel'])
		texts.add(word);
	return [...texts];
}

/**
 * The identifying texts found in `output` (empty when it is clean). `except` leaves out texts a
 * page may rightly show, such as the signed-in researcher's own name and organisation.
 */
export function identifyingTextsIn(output: string, except: readonly string[] = []): string[] {
	const lower = output.toLowerCase();
	return identifyingDemoTexts().filter(
		(t) => !except.includes(t) && lower.includes(t.toLowerCase())
	);
}
