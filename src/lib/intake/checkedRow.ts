/**
 * One preview row as the import would read it (POST /api/v1/imports/:id/check): the server's
 * answer and the mapping page's type, browser-safe.
 */
export type CheckedRow =
	| {
			ok: true;
			reading: {
				memberLabel: string;
				xMm: number | null;
				yMm: number | null;
				coverMm: number;
				barDiameterMm: number | null;
				barSpacingMm: number | null;
				barDirection: string | null;
				note: string | null;
			};
	  }
	| { ok: false; reason: string };
