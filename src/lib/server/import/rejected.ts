import { IMPORT_LIMITS } from './limits';

// The app's one CSV writer and formula guard (src/lib/csv.ts): rejected cells are the file's
// own text, any of which may be a formula meant for whoever opens the download.
import { csvLine } from '$lib/csv';

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

	/** `rowWord` names a row in messages: a file's "Row", the entry grid's "Grid row". */
	constructor(private readonly rowWord = 'Row') {}

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
		return `${this.rowWord} ${first.firstRow}: ${first.example}${tail}.`;
	}

	toCsv(headers: readonly string[]): string | null {
		if (this.count === 0) return null;
		// A loop, not Math.max(...rows): up to 100,000 kept rows would overflow the call stack.
		let width = headers.length;
		for (const row of this.kept) width = Math.max(width, row.length - 2);
		const names = Array.from({ length: width }, (_, i) => headers[i] || `column ${i + 1}`);
		const data = [...this.kept];
		if (this.count > this.kept.length) {
			data.push(['', `${this.count - this.kept.length} further rejected rows are not listed`]);
		}
		let text = csvLine(['row', 'reason', ...names]);
		for (const row of data) text += csvLine(row);
		return text;
	}
}
