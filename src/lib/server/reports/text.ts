/**
 * Words and figures for the report. pdfkit's built-in Helvetica covers WinAnsi only, so symbols
 * outside it are spelled out (no font download, STACK.md); everything else passes through.
 */
const REPLACEMENTS: Record<string, string> = {
	'√': 'sqrt',
	'≥': '>=',
	'≤': '<=',
	'−': '-',
	β: 'beta',
	γ: 'gamma',
	Δ: 'delta ',
	Φ: 'Phi',
	'→': '->',
	'×': 'x',
	'²': '²',
	'≈': '~',
	α: 'alpha',
	μ: 'mu',
	σ: 'sigma',
	'₀': '0'
};

export function pdfText(text: string): string {
	let out = '';
	for (const ch of text) {
		const code = ch.codePointAt(0)!;
		if (REPLACEMENTS[ch] !== undefined) out += REPLACEMENTS[ch];
		else if (code < 0x100 || '–—‘’“”•…'.includes(ch)) out += ch;
		else out += '?';
	}
	return out;
}

export const pct = (share: number | null | undefined, digits = 1) =>
	share === null || share === undefined ? '–' : `${(share * 100).toFixed(digits)} %`;
export const mm = (value: number | null | undefined, digits = 1) =>
	value === null || value === undefined ? '–' : `${value.toFixed(digits)} mm`;
export const num = (value: number | null | undefined, digits = 2) =>
	value === null || value === undefined ? '–' : value.toFixed(digits);
export const dateOnly = (iso: string | null) => (iso ? iso.slice(0, 10) : '–');
