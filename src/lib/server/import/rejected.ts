import Papa from 'papaparse';
import { IMPORT_LIMITS } from './limits';

// The app's one formula guard (src/lib/csv.ts). It used to let "-" followed by a digit pass, so
// a rejected cell such as "-2+3+cmd|' /C calc'!A0" reached the spreadsheet as a live formula.
import { FORMULA_START } from '$lib/csv';

export interface RejectionSummary {
	code: string;
	count: number;
	firstRow: number;
	example: string;
}

/**
 * The rows an import refused, each with its row number and reason, for the downloadable CSV.
 * Beyond `maxRejectedRowsKept` only the count grows: the user still has the file itself.
 */
export class RejectedRows {
	count = 0;
	private readonly kept: string[][] = [];
	private readonly byCode = new Map<string, RejectionSummary>();

	add(rowNumber: number, code: string, reason: string, cells: readonly string[]): void {
		this.count++;
		if (this.kept.length < IMPORT_LIMITS.maxRejectedRowsKept) {
			this.kept.push([String(rowNumber), reason, ...cells]);
		}
		const seen = this.byCode.get(code);
		if (seen) seen.count++;
		else this.byCode.set(code, { code, count: 1, firstRow: rowNumber, example: reason });
	}

	/** The most frequent reasons first, each with its first row: enough to fix a file. */
	summary(limit = 5): RejectionSummary[] {
		return [...this.byCode.values()].sort((a, b) => b.count - a.count).slice(0, limit);
	}

	/** One sentence naming the first problem and how many rows share problems. */
	describe(): string {
		const [first] = this.summary(1);
		if (!first) return '';
		const others = this.count - 1;
		const tail =
			others > 0 ? ` (and ${others} more row${others === 1 ? '' : 's'} with problems)` : '';
		return `Row ${first.firstRow}: ${first.example}${tail}.`;
	}

	toCsv(headers: readonly string[]): string | null {
		if (this.count === 0) return null;
		const width = Math.max(headers.length, ...this.kept.map((r) => r.length - 2));
		const names = Array.from({ length: width }, (_, i) => headers[i] || `column ${i + 1}`);
		const data = [...this.kept];
		if (this.count > this.kept.length) {
			data.push(['', `${this.count - this.kept.length} further rejected rows are not listed`]);
		}
		return Papa.unparse(
			{ fields: ['row', 'reason', ...names], data },
			{ escapeFormulae: FORMULA_START, newline: '\r\n' }
		);
	}
}
