/**
 * The chloride profiles behind measured projections: for each, its fit in a table row and a
 * chart of the measured points, the excluded outermost increment marked and the fitted curve.
 */
import { m2PerSToMm2PerYear } from '$lib/analysis';
import type { ProfileChartData } from '$lib/charts/chlorideProfile';
import type { MeasuredLocation, RiskAnnex } from '$lib/server/risk';
import type { ReportWriter } from '../layout';

type Fit = NonNullable<MeasuredLocation['fit']>;

function chartData(
	location: MeasuredLocation,
	fit: Fit,
	criticalContent: number | null
): ProfileChartData {
	return {
		label: `${location.label} on ${location.memberLabel} (${location.testedOn}, ${location.ageYears.toFixed(1)} years)`,
		points: fit.points,
		fit:
			fit.status === 'fitted'
				? {
						surfaceContent: fit.surfaceContent!,
						initialContent: fit.initialContent.value,
						dMm2PerYear: m2PerSToMm2PerYear(fit.dM2PerS!),
						ageYears: location.ageYears
					}
				: null,
		criticalContent
	};
}

function fitWords(fit: Fit): string {
	if (fit.status === 'refused') return `Not fitted: ${fit.reason}`;
	return `C_s ${fit.surfaceContent!.toFixed(2)} ± ${fit.surfaceContentSe!.toFixed(2)} % of binder; D_a ${fit.dM2PerS!.toExponential(2)} ± ${fit.dSeM2PerS!.toExponential(1)} m²/s (± one standard error); residual SD ${fit.residualSd!.toFixed(3)} %; C_0 ${fit.initialContent.value} % (${fit.initialContent.basis}).`;
}

export function chlorideProfilesSection(
	w: ReportWriter,
	annex: RiskAnnex,
	draw: (data: ProfileChartData) => { png: Buffer; aspect: number }
): void {
	const measured = annex.populations.filter((p) => p.measured?.kind === 'chloride');
	if (measured.length === 0) return;
	w.doc.addPage();
	w.heading('Chloride profiles');
	w.paragraph(
		'Each profile as measured (contents converted to % by mass of binder where the laboratory reported them by mass of concrete), with the error-function curve fitted to it by nonlinear least squares. The outermost increment is left out of the fit, as ASTM C1556 and NT BUILD 443 do, and is marked with a cross. C_crit is an assumption.',
		{ size: 9 }
	);
	for (const p of measured) {
		// The part's heading stays with its first chart (a chart is about 200 points tall).
		w.ensureSpace(260);
		w.heading(p.label, 2);
		const critical = p.measured!.criticalContent?.value ?? null;
		for (const location of p.measured!.locations) {
			const fit = location.fit;
			if (!fit) continue;
			const { png, aspect } = draw(chartData(location, fit, critical));
			const note = fit.conversion ? ` Converted: ${fit.conversion}.` : '';
			w.image(png, `${location.label} (${location.memberLabel}): ${fitWords(fit)}${note}`, aspect);
		}
	}
}
