import type { PageLoad } from './$types';
import type { ResearchStatistics } from '$lib/server/research/statistics';

/**
 * The figures, fetched from /api/v1/research/statistics with the filter in the page's URL, so
 * a view can be bookmarked and a change of filter is a navigation that refetches.
 */
export const load: PageLoad = async ({ fetch, url, data }) => {
	const params = new URLSearchParams(url.searchParams);
	if (!params.has('groupBy')) params.set('groupBy', 'memberType,exposureClass');
	params.set('charts', 'true');
	const response = await fetch(`/api/v1/research/statistics?${params}`);
	const body = await response.json();
	return {
		...data,
		query: url.searchParams.toString(),
		groupBy: params.getAll('groupBy').flatMap((g) => g.split(',')),
		statistics: response.ok ? (body as ResearchStatistics) : null,
		problem: response.ok ? null : (body.error as { message: string; field?: string })
	};
};
