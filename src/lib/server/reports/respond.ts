/** The report PDF as an HTTP answer (download). */
import type { AssessedSource } from '$lib/server/risk';
import { buildReportPdf, reportFileName } from './pdf';

export async function pdfResponse(source: AssessedSource): Promise<Response> {
	const pdf = await buildReportPdf(source);
	return new Response(new Uint8Array(pdf), {
		headers: {
			'content-type': 'application/pdf',
			'content-disposition': `attachment; filename="${reportFileName(source)}"`,
			'content-length': String(pdf.length),
			'cache-control': 'private, no-store'
		}
	});
}
