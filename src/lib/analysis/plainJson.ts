/**
 * Make a result safe for JSON and for an immutable snapshot.
 */

/**
 * Deep copy with every non-finite number (NaN, ±Infinity) replaced by null and typed arrays
 * turned into plain arrays. Cost O(size of the result), small for an assessment.
 * @example toPlainJson({ a: NaN, b: [1, Infinity] }) // { a: null, b: [1, null] }
 */
export function toPlainJson<T>(value: T): T {
	return convert(value) as T;
}

function convert(value: unknown): unknown {
	if (typeof value === 'number') return Number.isFinite(value) ? value : null;
	if (ArrayBuffer.isView(value)) return Array.from(value as Float64Array, (v) => convert(v));
	if (Array.isArray(value)) return value.map(convert);
	if (value !== null && typeof value === 'object') {
		const out: Record<string, unknown> = {};
		for (const [key, v] of Object.entries(value)) {
			if (typeof v !== 'function' && v !== undefined) out[key] = convert(v);
		}
		return out;
	}
	return value;
}
