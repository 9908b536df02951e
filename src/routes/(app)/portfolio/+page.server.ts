import type { PageServerLoad } from './$types';
import { pageActor } from '$lib/server/web/guard';
import { portfolio, RISK_WORDS } from '$lib/server/risk';

export const load: PageServerLoad = async (event) => {
	const actor = pageActor(event, 'report:read');
	const { entries, lookFirst } = await portfolio(actor);
	return {
		assets: entries.map((e) => ({
			...e.asset,
			assessment: e.latest
				? {
						id: e.latest.header.id,
						title: e.latest.header.title,
						approvedAt: e.latest.header.approvedAt,
						level: e.latest.risk.level,
						words: e.latest.risk.words,
						reason: e.latest.risk.reason,
						shareBelowCMin: e.latest.risk.shareBelowCMin,
						atDesignLife: e.latest.risk.shareDepassivatedAtDesignLife
					}
				: null
		})),
		lookFirst: lookFirst.slice(0, 10).map((p) => ({
			key: `${p.assetId}:${p.populationId}`,
			assetId: p.assetId,
			assetName: p.assetName,
			label: p.label,
			level: p.level,
			words: RISK_WORDS[p.level],
			reason: p.reason,
			areaM2: p.areaM2
		}))
	};
};
