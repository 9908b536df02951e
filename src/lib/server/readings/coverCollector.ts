/**
 * Covers gathered per member while an import streams, in growable typed arrays (8 bytes a
 * reading, not a JS number in an array): a million readings hold 8 MB, not ~30 MB of boxes.
 */
export class CoverCollector {
	private readonly byMember = new Map<number, { values: Float64Array; length: number }>();

	add(memberId: number, coverMm: number): void {
		let entry = this.byMember.get(memberId);
		if (!entry) this.byMember.set(memberId, (entry = { values: new Float64Array(256), length: 0 }));
		if (entry.length === entry.values.length) {
			const grown = new Float64Array(entry.values.length * 2);
			grown.set(entry.values);
			entry.values = grown;
		}
		entry.values[entry.length++] = coverMm;
	}

	/** Each member's covers, sorted ascending, by member id. */
	sortedByMember(): Map<number, Float64Array> {
		const out = new Map<number, Float64Array>();
		for (const [memberId, { values, length }] of this.byMember)
			out.set(memberId, values.slice(0, length).sort());
		return out;
	}
}
