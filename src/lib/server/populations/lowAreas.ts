/**
 * Low-cover areas per member of each population (the map's connected cells below c_min), for
 * the owner's page and the report: which member to treat first and how much area. Each member's
 * map is binned in SQL (coverMapGrid.ts), so this reads no readings into Node.
 */
import { Member } from '$lib/server/db';
import { groupLowAreas, lowCoverAreas } from '$lib/populations/lowCoverAreas';
import type { LowAreaSummary } from '$lib/words';
import { coverMapGrid } from './coverMapGrid';

export interface MemberLowAreas extends LowAreaSummary {
	memberId: number;
	cMinMm: number;
	/** The member's share below c_min (0–1), small spots included, and each listed area's m², largest first. */
	share: number;
	areasM2: number[];
	spotCount: number;
	spotM2: number;
}

export interface PopulationLowAreas {
	id: string;
	label: string;
	/** Members with at least one area below their c_min, the most area first. */
	members: MemberLowAreas[];
}

/** Members mapped at once: each is two small grouped queries. */
const CONCURRENCY = 4;

/** The low areas of the members of each population, against each member's own c_min. */
export async function populationLowAreas(
	populations: readonly { id: string; label: string; members: readonly { id: number }[] }[]
): Promise<PopulationLowAreas[]> {
	const ids = [...new Set(populations.flatMap((p) => p.members.map((m) => m.id)))];
	const members = await Member.findAll({
		attributes: ['id', 'label', 'cMinMm', 'gridWidthMm', 'gridHeightMm'],
		where: { id: ids },
		raw: true
	});
	const byId = new Map<
		number,
		{
			label: string;
			cMinMm: number;
			share: number;
			areas: number[];
			spots: { count: number; areaM2: number };
		}
	>();
	for (let k = 0; k < members.length; k += CONCURRENCY) {
		await Promise.all(
			members.slice(k, k + CONCURRENCY).map(async (m) => {
				const areas = lowCoverAreas(await coverMapGrid(m), m.cMinMm);
				// The map's default rule: single cells and areas under SMALL_AREA_M2 are spots.
				const { listed, spots } = groupLowAreas(areas);
				byId.set(m.id, {
					label: m.label,
					cMinMm: m.cMinMm,
					share: areas.reduce((s, a) => s + a.share, 0),
					areas: listed.map((a) => a.areaM2),
					spots
				});
			})
		);
	}
	return populations.map((p) => ({
		id: p.id,
		label: p.label,
		members: p.members
			.flatMap((pm) => {
				const m = byId.get(pm.id);
				if (!m || m.areas.length + m.spots.count === 0) return [];
				return [
					{
						memberId: pm.id,
						memberLabel: m.label,
						populationLabel: p.label,
						cMinMm: m.cMinMm,
						areaCount: m.areas.length,
						areaM2: m.areas.reduce((s, a) => s + a, 0),
						share: m.share,
						areasM2: m.areas,
						spotCount: m.spots.count,
						spotM2: m.spots.areaM2
					}
				];
			})
			.sort((a, b) => b.areaM2 - a.areaM2)
	}));
}
