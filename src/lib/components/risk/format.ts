/** Figures as the owner's pages show them. */
export const percent = (share: number | null | undefined, digits = 1) =>
	share === null || share === undefined ? '–' : `${(share * 100).toFixed(digits)} %`;
export const area = (m2: number | null) => (m2 === null ? 'unknown' : `${m2.toFixed(0)} m²`);
