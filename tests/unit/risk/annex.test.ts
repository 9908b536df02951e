import { describe, expect, it } from 'vitest';
import { spacingSummary } from '$lib/analysis/barsAndSpacing';
import { countedFromSorted } from '$lib/analysis/countedSample';
import { buildAnnex } from '$lib/server/risk/annex';
import type { SnapshotLike } from '$lib/server/risk/source';

/** 200,000 covers of one member: more than Math.min(...covers) can take as arguments. */
const COUNT = 200_000;
const covers = Array.from({ length: COUNT }, (_, i) => 20 + (i % 401) / 10); // 20.0 … 60.0 mm

const snapshot: SnapshotLike = {
	engineVersion: 'test',
	computedAt: '2026-12-04T00:00:00Z',
	asset: {
		id: 1,
		name: 'Invented deck',
		locationText: null,
		designCode: 'EN 1992-1-1',
		designServiceLifeYears: 50,
		yearOfConstruction: null
	},
	survey: null,
	surveys: [],
	populations: [
		{
			id: 'slab|XC3',
			key: { memberType: 'slab', exposureClass: 'XC3' },
			label: 'Slabs, XC3',
			members: [{ id: 7, label: 'S-01', surveyId: 1, face: 'top', readings: COUNT }],
			requirement: { governingMember: 'S-01', note: null },
			assessment: null,
			problem: null
		}
	],
	meter: { holes: [], verification: null, note: null },
	readingCount: COUNT
};

describe('a member with 200,000 readings', () => {
	it('the risk annex summarises it (least and greatest cover) without overflowing the call stack', () => {
		const data = new Map([
			[
				7,
				{
					sample: countedFromSorted(Float64Array.from(covers).sort()),
					gridWidthMm: 10_000,
					gridHeightMm: 2_000
				}
			]
		]);
		const annex = buildAnnex(snapshot, data, {} as never);
		expect(annex.members).toHaveLength(1);
		expect(annex.members[0]).toMatchObject({ n: COUNT, minMm: 20, maxMm: 60 });
	});

	it('bar spacing statistics take 200,000 spacings', () => {
		const spacings = Array.from({ length: COUNT }, (_, i) => 140 + (i % 21)); // 140 … 160 mm
		const summary = spacingSummary(spacings, 150, 10);
		expect(summary.minMm).toBe(140);
		expect(summary.maxMm).toBe(160);
		expect(summary.shareWithinTolerance).toBe(1);
	});
});
