// jstat 1.9.6 ships no types: declare only the distribution functions the engine uses.
declare module 'jstat' {
	interface Continuous2 {
		pdf(x: number, a: number, b: number): number;
		cdf(x: number, a: number, b: number): number;
		inv(p: number, a: number, b: number): number;
	}
	interface StudentT {
		pdf(x: number, dof: number): number;
		cdf(x: number, dof: number): number;
		inv(p: number, dof: number): number;
	}
	interface NoncentralT {
		pdf(x: number, dof: number, ncp: number): number;
		cdf(x: number, dof: number, ncp: number): number;
	}
	interface JStatStatic {
		normal: Continuous2;
		beta: Continuous2;
		studentt: StudentT;
		noncentralt: NoncentralT;
		/** Chi-square distribution: cdf(x, dof). */
		chisquare: StudentT;
		/** F distribution: cdf(x, df1, df2). */
		centralF: Continuous2;
		gammaln(x: number): number;
		erf(x: number): number;
		erfc(x: number): number;
		erfcinv(p: number): number;
	}
	const jStat: JStatStatic;
	export default jStat;
}
