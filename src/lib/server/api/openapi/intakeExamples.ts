/**
 * The examples of intake's operations: one invented survey taken in from start to finish, each
 * example acting on what the one before it made (the test calls them in the document's order).
 */
export const exampleAsset = {
	name: 'Quarry Lane Retaining Wall',
	designCode: 'EN 1992-1-1',
	yearOfConstruction: 1998,
	designServiceLifeYears: 50
};
export const exampleSurvey = { title: 'Wall face scan', surveyDate: '2026-04-14' };
// EN 1992-1-1 Table 4.4N, S4, XC4: c_min,dur 30 mm; (4.1): c_nom = 30 + 10 mm.
export const exampleMember = {
	label: 'W-01',
	memberType: 'wall',
	face: 'side',
	exposureClass: 'XC4',
	requirementSource: 'EN 1992-1-1',
	structuralClass: 'S4',
	cMinMm: 30,
	cNomMm: 40,
	deltaCDevMm: 10,
	barDiameterMm: 12,
	barSpacingMm: 200,
	gridWidthMm: 3000,
	gridHeightMm: 2000
};
export const exampleHole = {
	label: 'H1',
	xMm: 400,
	yMm: 600,
	meterReadingMm: 38,
	measuredCoverMm: 41
};
export const exampleMemberTable =
	'label\ttype\tface\texposure\tbar diameter\nW-02\twall\tside\tXC4\t12\nW-03\twall\tside\tXD1\t16';
/** Readings typed into the entry grid of member W-01. */
export const exampleEntry = {
	units: 'mm',
	rows: [
		{ x: '100', y: '200', cover: '41.5' },
		{ x: '300', y: '200', cover: '39' }
	]
};
/** A meter's log: the last row has no cover, so it comes back among the rejected rows. */
export const exampleReadingsCsv =
	'Member,X,Y,Cover\nW-01,0,100,42\nW-02,200,100,38.5\nW-03,400,100,not read\n';
export const exampleStart = {
	mapping: { memberLabel: 0, x: 1, y: 2, cover: 3 },
	options: { failingRows: 'import-valid', headerRowIndex: 0 }
};
export const exampleMeterFile = 'scan,x,y,cover\n1,0,100,42\n1,200,100,38.5\n';
/** A carbonation test on member W-01: four depths read along a split core's face. */
export const exampleCarbonationTest = {
	label: 'CT1',
	xMm: 1200,
	yMm: 300,
	testedOn: '2026-02-10',
	depthsMm: [8, 11, 9.5, 12],
	method: 'Phenolphthalein sprayed on a freshly split core face'
};
/** A chloride profile on member W-01, contents by mass of concrete with the conversion's values. */
export const exampleChlorideProfile = {
	label: 'CP1',
	xMm: 1500,
	yMm: 600,
	testedOn: '2026-02-10',
	basis: 'concrete',
	binderContentKgM3: 340,
	concreteDensityKgM3: 2350,
	initialContentPercent: 0.01,
	method: 'Dust drilled in steps, acid-soluble chloride by titration',
	increments: [
		{ fromMm: 0, toMm: 5, chloridePercent: 0.42 },
		{ fromMm: 5, toMm: 10, chloridePercent: 0.36 },
		{ fromMm: 10, toMm: 20, chloridePercent: 0.22 },
		{ fromMm: 20, toMm: 30, chloridePercent: 0.11 },
		{ fromMm: 30, toMm: 40, chloridePercent: 0.05 }
	]
};
