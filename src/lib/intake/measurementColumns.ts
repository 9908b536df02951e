/**
 * The columns of a file of carbonation tests or chloride profiles. One row is one carbonation
 * test; for chloride, one row is one depth increment, and the rows with the same member,
 * location and test date make one profile. Lengths in mm, contents in % by mass of the basis.
 * The import page shows these descriptions as its help text; docs/data-model.md repeats them.
 * Browser-safe: the mapping form and the server read the same list.
 */
export const CARBONATION_FIELDS = [
	['memberLabel', 'member label', 'The member the test was taken on (as labelled in this survey).'],
	['label', 'location', 'The test location’s label, unique on its member (e.g. CT1).'],
	['x', 'x (mm)', 'Position on the member’s grid, mm (optional).'],
	['y', 'y (mm)', 'Position on the member’s grid, mm (optional).'],
	['testedOn', 'test date', 'YYYY-MM-DD, or a spreadsheet date.'],
	['depths', 'depth readings (mm)', 'The depths read, separated by ";" or spaces (e.g. 8;11;9.5).'],
	['depthMin', 'minimum depth (mm)', 'As read (optional).'],
	['depthMean', 'mean depth (mm)', 'As read; needed when no readings are given.'],
	['depthMax', 'maximum depth (mm)', 'As read (optional).'],
	['method', 'method', 'E.g. phenolphthalein on a split core (optional).'],
	['notes', 'notes', 'Free text (optional).']
] as const;

export const CHLORIDE_FIELDS = [
	['memberLabel', 'member label', 'The member the profile was taken on.'],
	['label', 'profile', 'The profile’s label; member, profile and date together name a profile.'],
	[
		'x',
		'x (mm)',
		'Position on the member’s grid, mm (optional; taken from the profile’s first row).'
	],
	['y', 'y (mm)', 'Position on the member’s grid, mm (optional; from the first row).'],
	['testedOn', 'test date', 'YYYY-MM-DD, or a spreadsheet date.'],
	['fromMm', 'from (mm)', 'Depth where the increment starts, mm from the surface.'],
	['toMm', 'to (mm)', 'Depth where the increment ends, mm.'],
	['chloridePercent', 'chloride (%)', 'Chloride content of the increment, % by mass of the basis.'],
	[
		'basis',
		'basis',
		'"binder" or "concrete": what the % is of; the same on every row of a profile.'
	],
	['binderContent', 'binder content (kg/m³)', 'Assumed binder content; needed for basis concrete.'],
	['concreteDensity', 'concrete density (kg/m³)', 'Assumed density; needed for basis concrete.'],
	['initialContent', 'background chloride (%)', 'Ci, measured or stated (optional).'],
	['method', 'method', 'E.g. acid-soluble, dust from drilled increments (optional).'],
	['notes', 'notes', 'Free text (optional).']
] as const;
