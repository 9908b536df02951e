/**
 * A file name safe to store and to send back in Content-Disposition: no path, no control or
 * reserved characters, no leading dots, at most 120 characters, the extension kept.
 */
export function sanitiseFileName(raw: string, fallback = 'file'): string {
	const base = raw.split(/[\\/]/).pop() ?? '';
	const cleaned = base
		.normalize('NFC')
		// eslint-disable-next-line no-control-regex -- removing control characters is the point
		.replace(/[\u0000-\u001f\u007f<>:"|?*\u202a-\u202e\u2066-\u2069]/g, '')
		.replace(/\s+/g, ' ')
		.replace(/^[.\s]+/, '')
		.trim();
	if (!cleaned) return fallback;
	if (cleaned.length <= 120) return cleaned;
	const dot = cleaned.lastIndexOf('.');
	const ext = dot > 0 && cleaned.length - dot <= 10 ? cleaned.slice(dot) : '';
	return cleaned.slice(0, 120 - ext.length) + ext;
}

/** For Content-Disposition: an ASCII fallback plus the UTF-8 name (RFC 6266, RFC 5987). */
export function contentDisposition(fileName: string, kind: 'inline' | 'attachment'): string {
	const ascii = fileName.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
	return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(fileName)}`;
}
