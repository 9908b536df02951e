/** The report PDF and its shared links. */
export { buildReportPdf, reportFileName } from './pdf';
export { pdfResponse } from './respond';
export * from './links';
