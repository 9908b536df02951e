/**
 * Records of a file in the order read. A reader that skips rows (an XLSX sheet leaves out
 * empty rows) gives each record's row number in the file; otherwise records are numbered in
 * order from 1.
 */
export type RecordBatch = string[][] & { rowNumbers?: readonly number[] };
