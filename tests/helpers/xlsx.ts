import { buildZip, type ZipEntry } from './zip';

/*
 * Hand-made XLSX files for the reader's hostile cases, which no spreadsheet program writes:
 * the parts of ECMA-376 Part 1 (§12.3) a reader needs, and nothing else.
 */

export interface SheetSpec {
	name: string;
	/** The sheet part's whole XML. */
	xml: string;
}

const escapeXml = (text: string) =>
	text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

const columnName = (index: number) => String.fromCharCode(65 + index); // A..Z is enough here

/** A worksheet's XML with inline strings and numbers, every cell with its reference as a
 * spreadsheet program writes it; `r` gives a row its number (else the next one). */
export function sheetXml(rows: { r?: number; cells: (string | number)[] }[]): string {
	let number = 0;
	const body = rows
		.map((row) => {
			number = row.r ?? number + 1;
			const cells = row.cells
				.map((value, i) => {
					const ref = `${columnName(i)}${number}`;
					return typeof value === 'number'
						? `<c r="${ref}"><v>${value}</v></c>`
						: `<c r="${ref}" t="inlineStr"><is><t>${escapeXml(value)}</t></is></c>`;
				})
				.join('');
			return `<row r="${number}">${cells}</row>`;
		})
		.join('');
	return `<?xml version="1.0" encoding="UTF-8"?><worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData>${body}</sheetData></worksheet>`;
}

/** A workbook of `sheets`, with an optional shared-string part (whose declared size may lie). */
export function buildXlsx(
	sheets: SheetSpec[],
	sharedStrings?: { xml: string | Buffer; declaredSize?: number }
): Buffer {
	const ns = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
	const rel = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
	const entries: ZipEntry[] = [
		{
			name: '[Content_Types].xml',
			data: Buffer.from(
				'<?xml version="1.0"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"/>'
			)
		},
		{
			name: 'xl/workbook.xml',
			data: Buffer.from(
				`<?xml version="1.0"?><workbook xmlns="${ns}" xmlns:r="${rel}"><sheets>${sheets
					.map(
						(s, i) => `<sheet name="${escapeXml(s.name)}" sheetId="${i + 1}" r:id="rId${i + 1}"/>`
					)
					.join('')}</sheets></workbook>`
			)
		},
		{
			name: 'xl/_rels/workbook.xml.rels',
			data: Buffer.from(
				`<?xml version="1.0"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${sheets
					.map(
						(_s, i) =>
							`<Relationship Id="rId${i + 1}" Type="${rel}/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`
					)
					.join('')}</Relationships>`
			)
		},
		...sheets.map((s, i) => ({ name: `xl/worksheets/sheet${i + 1}.xml`, data: Buffer.from(s.xml) }))
	];
	if (sharedStrings) {
		entries.push({
			name: 'xl/sharedStrings.xml',
			data: Buffer.isBuffer(sharedStrings.xml) ? sharedStrings.xml : Buffer.from(sharedStrings.xml),
			declaredSize: sharedStrings.declaredSize
		});
	}
	return buildZip(entries);
}
