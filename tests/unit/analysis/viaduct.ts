// Reads the published RILEM TC 230-PSC viaduct deck population (see /work/shared/datasets/README.md).
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';

/** 200 cover readings (mm), from `../shared/datasets/` beside the repository root. */
export function viaductCoversMm(): number[] {
	const path = resolve(process.cwd(), '../shared/datasets/viaduct-deck-cover.csv');
	const lines = readFileSync(path, 'utf8').trim().split(/\r?\n/).slice(1);
	return lines.map((line) => Number(line.split(',')[0]));
}
