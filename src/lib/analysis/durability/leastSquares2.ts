/**
 * Levenberg–Marquardt for a model with two parameters, with MINPACK's three stopping tests.
 *
 * Our own code, and why: ml-levenberg-marquardt 5.1.0 (installed) stops only when the sum of
 * squares falls below an absolute `errorTolerance` or after `maxIterations`; it has no step or
 * gradient test and does not say whether it converged. On a chloride profile it either stopped
 * early (default tolerance 1e-2, Da off scipy's by 1.1e-4 relative after its 100 iterations with
 * finite differences) or, with the tolerance at 0 and an analytic Jacobian, reached scipy's
 * optimum to 4e-9 but always ran all its iterations (≈ 1.4 ms a profile, ml-matrix objects on
 * each step). Two parameters need only a 2×2 solve, so a plain loop is short and allocation-free.
 * The stopping tests follow MINPACK lmder (Moré, Garbow & Hillstrom 1980, as scipy's
 * curve_fit uses): relative reduction of the sum of squares (ftol), relative step (xtol) and
 * the cosine between residuals and the Jacobian's columns (gtol).
 */

/** Model values and their partial derivatives at a parameter pair, written into the arrays. */
export type ResidualModel = (
	p0: number,
	p1: number,
	values: Float64Array,
	d0: Float64Array,
	d1: Float64Array
) => void;

export interface LeastSquares2Result {
	p0: number;
	p1: number;
	/** Σ(y − f)² at the optimum. */
	sumOfSquares: number;
	/** JᵀJ at the optimum, [a00, a01, a11]. */
	jtj: [number, number, number];
	iterations: number;
	converged: boolean;
}

const FTOL = 1e-14;
const XTOL = 1e-12;
const GTOL = 1e-12;
const MAX_ITERATIONS = 200;

interface Work {
	values: Float64Array;
	d0: Float64Array;
	d1: Float64Array;
}

function sumOfSquares(y: ArrayLike<number>, values: Float64Array): number {
	let s = 0;
	for (let i = 0; i < y.length; i++) s += (y[i] - values[i]) ** 2;
	return s;
}

/** JᵀJ and Jᵀr at the current point. */
function normalEquations(y: ArrayLike<number>, w: Work): number[] {
	let a00 = 0,
		a01 = 0,
		a11 = 0,
		g0 = 0,
		g1 = 0;
	for (let i = 0; i < y.length; i++) {
		const r = y[i] - w.values[i];
		a00 += w.d0[i] * w.d0[i];
		a01 += w.d0[i] * w.d1[i];
		a11 += w.d1[i] * w.d1[i];
		g0 += w.d0[i] * r;
		g1 += w.d1[i] * r;
	}
	return [a00, a01, a11, g0, g1];
}

/**
 * Minimise Σ(yᵢ − f(xᵢ; p0, p1))² from a starting pair. Marquardt's scaling (λ·diag(JᵀJ)).
 * Cost O(n) a step, typically 5–20 steps. Returns converged: false when none of the three
 * tests held within 200 steps or the damping ran away.
 */
export function leastSquares2(
	y: ArrayLike<number>,
	model: ResidualModel,
	start: [number, number]
): LeastSquares2Result {
	const n = y.length;
	const now: Work = {
		values: new Float64Array(n),
		d0: new Float64Array(n),
		d1: new Float64Array(n)
	};
	const trial: Work = {
		values: new Float64Array(n),
		d0: new Float64Array(n),
		d1: new Float64Array(n)
	};
	let [p0, p1] = start;
	model(p0, p1, now.values, now.d0, now.d1);
	let ss = sumOfSquares(y, now.values);
	let lambda = 1e-3;
	let converged = false;
	let iterations = 0;
	let eq = normalEquations(y, now);
	for (; iterations < MAX_ITERATIONS && !converged; iterations++) {
		const [a00, a01, a11, g0, g1] = eq;
		const cosine =
			Math.max(Math.abs(g0) / Math.sqrt(a00 || 1), Math.abs(g1) / Math.sqrt(a11 || 1)) /
			Math.sqrt(ss || 1);
		if (ss === 0 || cosine <= GTOL) {
			converged = true;
			break;
		}
		const b00 = a00 * (1 + lambda);
		const b11 = a11 * (1 + lambda);
		const det = b00 * b11 - a01 * a01;
		const s0 = (g0 * b11 - g1 * a01) / det;
		const s1 = (g1 * b00 - g0 * a01) / det;
		const q0 = p0 + s0;
		const q1 = p1 + s1;
		model(q0, q1, trial.values, trial.d0, trial.d1);
		const trialSs = sumOfSquares(y, trial.values);
		if (Number.isFinite(trialSs) && trialSs <= ss) {
			const reduction = (ss - trialSs) / (ss || 1);
			// Predicted reduction of the linear model: sᵀJᵀJs + 2λ·sᵀ·diag(JᵀJ)·s (MINPACK's prered).
			const predicted =
				(a00 * s0 * s0 +
					2 * a01 * s0 * s1 +
					a11 * s1 * s1 +
					2 * lambda * (a00 * s0 * s0 + a11 * s1 * s1)) /
				(ss || 1);
			const smallStep =
				Math.abs(s0) <= XTOL * (Math.abs(q0) + XTOL) &&
				Math.abs(s1) <= XTOL * (Math.abs(q1) + XTOL);
			[p0, p1, ss] = [q0, q1, trialSs];
			now.values.set(trial.values);
			now.d0.set(trial.d0);
			now.d1.set(trial.d1);
			eq = normalEquations(y, now);
			lambda = Math.max(lambda / 10, 1e-12);
			converged = smallStep || (reduction <= FTOL && predicted <= FTOL);
		} else {
			lambda *= 10;
			if (lambda > 1e16) break;
		}
	}
	return { p0, p1, sumOfSquares: ss, jtj: [eq[0], eq[1], eq[2]], iterations, converged };
}
