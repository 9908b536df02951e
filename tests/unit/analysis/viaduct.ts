// Reads the published RILEM TC 230-PSC viaduct deck population (see ../shared/datasets/README.md).
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';

const DATASET = 'viaduct-deck-cover.csv';

/**
 * Where the shared datasets are: FRACTILE_DATASETS if set, else `../shared/datasets` beside the
 * checkout (CI and the main working copy), else the machine's shared folder (a clone made under
 * the OS temp folder, as the contributor guide's clean-clone check does).
 */
function datasetPath(): string {
	const candidates = [
		process.env.FRACTILE_DATASETS,
		resolve(process.cwd(), '../shared/datasets'),
		'/work/shared/datasets'
	].filter((dir): dir is string => Boolean(dir));
	for (const dir of candidates) {
		const path = resolve(dir, DATASET);
		if (existsSync(path)) return path;
	}
	throw new Error(
		`${DATASET} not found in ${candidates.join(', ')}; set FRACTILE_DATASETS to its folder`
	);
}

/** 200 cover readings (mm), from the shared datasets folder. */
export function viaductCoversMm(): number[] {
	const lines = readFileSync(datasetPath(), 'utf8').trim().split(/\r?\n/).slice(1);
	return lines.map((line) => Number(line.split(',')[0]));
}
