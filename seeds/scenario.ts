/**
 * The demo scenario: invented organisations, people and structures. Nothing here is real; the
 * e-mail addresses use the reserved .example domain (RFC 2606). Specified covers follow
 * EN 1992-1-1 §4.4.1 for structural class S4 with Δc_dev = 10 mm, worked out by the engine's
 * requirement tables (seeds/generate.ts).
 */
import type { Role } from '../src/lib/server/db/models/Membership';
import type { MemberFace, MemberType } from '../src/lib/server/db/models/Member';
import type { SurveyState } from '../src/lib/server/db/models/Survey';

export const DEMO_PASSWORD = 'cover-check-demo-2026';

export interface DemoPerson {
	email: string;
	displayName: string;
	organisation: string;
	role: Role;
}

export interface CoverPlan {
	model: 'normal' | 'lognormal';
	meanMm: number;
	sdMm: number;
	/** A region of low cover (a sagging chair, a screed laid thin): a second population. */
	lowPatch?: { xFraction: number; yFraction: number; radiusFraction: number; dropMm: number };
}

export interface DemoMemberPlan {
	label: string;
	memberType: MemberType;
	face: MemberFace;
	exposureClass: string;
	barDiameterMm: number;
	barSpacingMm: number;
	memberDepthMm: number;
	gridWidthMm: number;
	gridHeightMm: number;
	scanLineSpacingMm: number;
	cover: CoverPlan;
}

export interface DemoSurveyPlan {
	title: string;
	surveyDate: string;
	surveyorEmail: string;
	status: SurveyState;
	meterMake: string;
	meterSerial: string;
	meterCalibration: string;
	notes: string;
	members: DemoMemberPlan[];
	verificationHoleCount: number;
	/** The meter's logging step (mm); 0.1 unless given. */
	resolutionMm?: number;
}

export interface DemoAssetPlan {
	name: string;
	locationText: string;
	description: string;
	yearOfConstruction: number;
	designServiceLifeYears: number;
	sharedWith: string[];
	researchOptIn: boolean;
	surveys: DemoSurveyPlan[];
}

export const CONSULTANCY = 'Kestrel Lane Consulting';
export const OWNER = 'Northmoor Estates Trust';
export const RESEARCH = 'Durability Data Collective';

export const demoOrganisations = [
	{ name: CONSULTANCY, slug: 'kestrel-lane' },
	{ name: OWNER, slug: 'northmoor-estates' },
	{ name: RESEARCH, slug: 'durability-collective' }
];

export const demoPeople: DemoPerson[] = [
	{
		email: 'admin@kestrel-lane.example',
		displayName: 'Priya Castellane',
		organisation: CONSULTANCY,
		role: 'admin'
	},
	{
		email: 'engineer@kestrel-lane.example',
		displayName: 'Imogen Hartley',
		organisation: CONSULTANCY,
		role: 'engineer'
	},
	{
		email: 'surveyor@kestrel-lane.example',
		displayName: 'Tomasz Brennock',
		organisation: CONSULTANCY,
		role: 'surveyor'
	},
	{
		email: 'owner@northmoor.example',
		displayName: 'Gareth Pellow',
		organisation: OWNER,
		role: 'owner'
	},
	{
		email: 'researcher@durability-collective.example',
		displayName: 'Mina Okonjo-Reyes',
		organisation: RESEARCH,
		role: 'researcher'
	}
];

const meter = {
	meterMake: 'Generic pulse-induction cover meter, model PI-40',
	meterSerial: 'PI40-11873',
	meterCalibration: 'Checked on calibration block 2024-02-14'
};

function deckBays(
	prefix: string,
	count: number,
	lowPatchBays: number[],
	meanMm: number
): DemoMemberPlan[] {
	return Array.from({ length: count }, (_, i) => ({
		label: `${prefix}-${String(i + 1).padStart(2, '0')}`,
		memberType: 'deck' as const,
		face: 'top' as const,
		exposureClass: 'XD3',
		barDiameterMm: 16,
		barSpacingMm: 150,
		memberDepthMm: 250,
		gridWidthMm: 7200,
		gridHeightMm: 7200,
		scanLineSpacingMm: 300,
		cover: {
			model: 'normal' as const,
			meanMm: meanMm + (i % 3) - 1,
			sdMm: 6 + (i % 4) * 0.8,
			lowPatch: lowPatchBays.includes(i + 1)
				? { xFraction: 0.3 + 0.1 * (i % 3), yFraction: 0.6, radiusFraction: 0.22, dropMm: 20 }
				: undefined
		}
	}));
}

function repeat(count: number, make: (n: number) => DemoMemberPlan): DemoMemberPlan[] {
	return Array.from({ length: count }, (_, i) => make(i + 1));
}

export const demoAssets: DemoAssetPlan[] = [
	{
		name: 'Brackenfield Multi-storey Car Park',
		locationText: 'Brackenfield, Station Approach (invented)',
		description:
			'Five-level in-situ flat-slab car park; decks exposed to de-icing salts carried in on vehicles.',
		yearOfConstruction: 1998,
		designServiceLifeYears: 50,
		sharedWith: [OWNER],
		researchOptIn: true,
		surveys: [
			{
				title: 'Level 2 deck and soffits, condition survey',
				surveyDate: '2024-03-12',
				surveyorEmail: 'surveyor@kestrel-lane.example',
				status: 'approved',
				...meter,
				notes: 'Bays scanned on 300 mm lines across the top mat; soffits scanned from a tower.',
				verificationHoleCount: 5,
				members: [
					...deckBays('L2-BAY', 10, [4], 57),
					...repeat(4, (n) => ({
						label: `L2-SOFFIT-${n}`,
						memberType: 'slab',
						face: 'bottom',
						exposureClass: 'XC3',
						barDiameterMm: 12,
						barSpacingMm: 200,
						memberDepthMm: 250,
						gridWidthMm: 7200,
						gridHeightMm: 7200,
						scanLineSpacingMm: 400,
						cover: { model: 'lognormal', meanMm: 36 + n, sdMm: 5 }
					})),
					...repeat(4, (n) => ({
						label: `L2-COL-C${n}`,
						memberType: 'column',
						face: 'side',
						exposureClass: 'XD3',
						barDiameterMm: 25,
						barSpacingMm: 125,
						memberDepthMm: 450,
						gridWidthMm: 1800,
						gridHeightMm: 3000,
						scanLineSpacingMm: 250,
						cover: { model: 'normal', meanMm: 52, sdMm: 5.5 }
					}))
				]
			},
			{
				title: 'Roof deck, follow-up survey',
				surveyDate: '2025-04-08',
				surveyorEmail: 'surveyor@kestrel-lane.example',
				status: 'submitted',
				...meter,
				meterCalibration: 'Checked on calibration block 2025-03-30',
				notes: 'Roof deck resurfaced in 2019; scanned through the new wearing course where thin.',
				verificationHoleCount: 4,
				// This meter logs whole millimetres: ties the fit tests must allow for.
				resolutionMm: 1,
				members: deckBays('ROOF-BAY', 6, [], 60)
			}
		]
	},
	{
		name: 'Orchard Row Office Building',
		locationText: 'Orchard Row, Upper Town (invented)',
		description: 'Six-storey reinforced concrete frame with exposed perimeter beams and columns.',
		yearOfConstruction: 2009,
		designServiceLifeYears: 50,
		sharedWith: [OWNER],
		researchOptIn: true,
		surveys: [
			{
				title: 'Perimeter frame, pre-refurbishment survey',
				surveyDate: '2025-06-17',
				surveyorEmail: 'surveyor@kestrel-lane.example',
				status: 'submitted',
				...meter,
				meterCalibration: 'Checked on calibration block 2025-06-02',
				notes:
					'External perimeter beams and columns from a mobile platform; internal slabs from below.',
				verificationHoleCount: 4,
				members: [
					...repeat(8, (n) => ({
						label: `B-${n}0${n % 3}`,
						memberType: 'beam',
						face: n % 2 ? 'bottom' : 'side',
						exposureClass: 'XC3',
						barDiameterMm: 25,
						barSpacingMm: 150,
						memberDepthMm: 600,
						gridWidthMm: 6000,
						gridHeightMm: 600,
						scanLineSpacingMm: 150,
						cover: { model: 'lognormal', meanMm: n === 5 ? 29 : 38, sdMm: n === 5 ? 4 : 6 }
					})),
					...repeat(6, (n) => ({
						label: `C-${String.fromCharCode(64 + n)}${n + 1}`,
						memberType: 'column',
						face: 'side',
						exposureClass: 'XC4',
						barDiameterMm: 20,
						barSpacingMm: 100,
						memberDepthMm: 400,
						gridWidthMm: 1600,
						gridHeightMm: 3200,
						scanLineSpacingMm: 400,
						cover: { model: 'normal', meanMm: 43, sdMm: 4.5 }
					})),
					...repeat(4, (n) => ({
						label: `S-L${n}`,
						memberType: 'slab',
						face: 'bottom',
						exposureClass: 'XC1',
						barDiameterMm: 12,
						barSpacingMm: 200,
						memberDepthMm: 225,
						gridWidthMm: 6000,
						gridHeightMm: 6000,
						scanLineSpacingMm: 500,
						cover: { model: 'normal', meanMm: 27, sdMm: 4 }
					})),
					// One small population: two short parapet scans, too few readings for statistics.
					...repeat(2, (n) => ({
						label: `P-${n}`,
						memberType: 'wall',
						face: 'side',
						exposureClass: 'XC4',
						barDiameterMm: 12,
						barSpacingMm: 200,
						memberDepthMm: 200,
						gridWidthMm: 800,
						gridHeightMm: 600,
						scanLineSpacingMm: 300,
						cover: { model: 'normal', meanMm: 36, sdMm: 5 }
					}))
				]
			}
		]
	},
	{
		name: 'Millrace Footbridge',
		locationText: 'Millrace Park (invented)',
		description: 'Three-span footbridge over a tidal creek; salt spray on the deck edges.',
		yearOfConstruction: 1986,
		designServiceLifeYears: 60,
		sharedWith: [OWNER],
		researchOptIn: false,
		surveys: [
			{
				title: 'Deck and edge beams, principal inspection',
				surveyDate: '2025-09-23',
				surveyorEmail: 'surveyor@kestrel-lane.example',
				status: 'submitted',
				...meter,
				meterCalibration: 'Checked on calibration block 2025-09-01',
				notes: 'Access from the deck only; edge beams scanned on their outer faces.',
				verificationHoleCount: 3,
				members: [
					...repeat(3, (n) => ({
						label: `SPAN-${n}`,
						memberType: 'deck',
						face: 'top',
						exposureClass: 'XS1',
						barDiameterMm: 16,
						barSpacingMm: 150,
						memberDepthMm: 300,
						gridWidthMm: 9000,
						gridHeightMm: 2400,
						scanLineSpacingMm: 300,
						cover: { model: 'normal', meanMm: 44, sdMm: 7 }
					})),
					...repeat(2, (n) => ({
						label: `EDGE-${n === 1 ? 'N' : 'S'}`,
						memberType: 'beam',
						face: 'side',
						exposureClass: 'XS1',
						barDiameterMm: 20,
						barSpacingMm: 150,
						memberDepthMm: 700,
						gridWidthMm: 27000,
						gridHeightMm: 700,
						scanLineSpacingMm: 350,
						cover: { model: 'lognormal', meanMm: 41, sdMm: 8 }
					}))
				]
			}
		]
	}
];

export interface DemoAssessmentPlan {
	assetName: string;
	surveyTitle: string;
	title: string;
	recommendations: string;
	/** Saves the draft (policy 'assessment:write'). */
	savedBy: string;
	/** Approves it (policy 'assessment:approve'): a second person, as the organisation's rule asks. */
	approvedBy: string;
}

/** One approved assessment a demo asset, each of one survey, shared with the owner. */
export const demoAssessments: DemoAssessmentPlan[] = [
	{
		assetName: demoAssets[0].name,
		surveyTitle: demoAssets[0].surveys[0].title,
		title: 'Level 2 deck and soffits: cover assessment',
		recommendations:
			'Take chloride profiles in bay L2-BAY-04, where cover is lowest, before deciding on repairs. Plan a protective coating of the Level 2 deck within five years; recheck the columns at the next principal inspection.',
		savedBy: 'engineer@kestrel-lane.example',
		approvedBy: 'admin@kestrel-lane.example'
	},
	{
		assetName: demoAssets[1].name,
		surveyTitle: demoAssets[1].surveys[0].title,
		title: 'Perimeter frame: cover assessment before refurbishment',
		recommendations:
			'Measure carbonation depths on beam B-502, the member with the thinnest cover, and on two columns before the refurbishment is designed. Keep the parapets under review: too few readings to judge them.',
		savedBy: 'engineer@kestrel-lane.example',
		approvedBy: 'admin@kestrel-lane.example'
	},
	{
		assetName: demoAssets[2].name,
		surveyTitle: demoAssets[2].surveys[0].title,
		title: 'Deck and edge beams: cover assessment',
		recommendations:
			'Take chloride samples on the deck edges exposed to spray at the next principal inspection; no action on cover alone.',
		savedBy: 'engineer@kestrel-lane.example',
		approvedBy: 'admin@kestrel-lane.example'
	}
];
