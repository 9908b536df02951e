/** Limits of the import path, in one place so the pages can quote them. */
export const IMPORT_LIMITS = {
	/** The upload route's own limit; adapter-node's BODY_SIZE_LIMIT must be at least this. */
	maxFileBytes: 60 * 1024 * 1024,
	/** A line longer than this is not a meter export (or is a binary file); the file is refused. */
	maxLineBytes: 16 * 1024,
	maxRows: 2_000_000,
	/** Bytes read from the start of a file to detect its format and settings. */
	sampleBytes: 64 * 1024,
	previewRows: 20,
	/** An XLSX file may unpack to this much; more is treated as a zip bomb. */
	maxUnpackedXlsxBytes: 256 * 1024 * 1024,
	maxCompressionRatio: 200,
	/** An XLSX shared string table is held in memory while the sheet is read. */
	maxSharedStringsBytes: 64 * 1024 * 1024,
	/** Columns of a sheet; a readings file has a dozen. */
	maxColumns: 256,
	defaultCoverMaxMm: 300,
	widenedCoverMaxMm: 1000,
	/** Rows per INSERT batch (connector batch()) inside the import's one transaction. */
	insertChunkRows: 10_000,
	/** Rows per LOAD DATA chunk file (about 2 MB of text). */
	loadDataChunkRows: 50_000,
	/** Rejected rows kept for the downloadable CSV (the file itself still holds every row). */
	maxRejectedRowsKept: 100_000,
	progressIntervalMs: 500,
	/** A running import whose heartbeat is older than this was abandoned by its process. */
	staleAfterMs: 60_000
} as const;
