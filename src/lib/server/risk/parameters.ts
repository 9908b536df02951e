/**
 * The engineer's durability parameters, with the defaults stated and sourced. The model follows
 * the exposure class: XC* → carbonation x = k·√t; XD or XS → chloride, Fick's second law
 * (src/lib/analysis/durability). Every default below says where it comes from; where the source
 * is our memory of the literature, it says so — an engineer should replace them with values
 * measured on the structure (carbonation depths, chloride profiles).
 */
import { z } from 'zod';

export interface SourcedValue {
	value: number;
	source: string;
}

/** Carbonation coefficient k (mm/√year) per XC class, with the model scatter of the depth. */
export const CARBONATION_DEFAULTS: Record<string, { k: SourcedValue; depthCov: SourcedValue }> = {
	XC1: {
		k: {
			value: 4,
			source:
				'From memory: dry indoor concrete, w/c ≈ 0.5, CEM I; ranges as in fib Bulletin 34 (2006) background, not checked. Dry concrete carbonates fast but seldom corrodes.'
		},
		depthCov: {
			value: 0.3,
			source: 'Our choice, no standard: a wide scatter of k across a member.'
		}
	},
	XC2: {
		k: {
			value: 2,
			source:
				'From memory: wet, rarely dry concrete carbonates slowly (fib Bulletin 34 background), not checked.'
		},
		depthCov: { value: 0.3, source: 'Our choice, no standard.' }
	},
	XC3: {
		k: {
			value: 4,
			source:
				'From memory: sheltered outdoor or moderately humid indoor, w/c ≈ 0.5 (fib Bulletin 34 background), not checked.'
		},
		depthCov: { value: 0.3, source: 'Our choice, no standard.' }
	},
	XC4: {
		k: {
			value: 3,
			source:
				'From memory: cyclic wet and dry, rain slows carbonation (fib Bulletin 34 background), not checked.'
		},
		depthCov: { value: 0.3, source: 'Our choice, no standard.' }
	}
};

export interface ChlorideDefaults {
	surfaceContent: SourcedValue;
	initialContent: SourcedValue;
	criticalContent: SourcedValue;
	dM2PerS: SourcedValue;
	dCov: SourcedValue;
}

const chlorideCommon = {
	initialContent: {
		value: 0.1,
		source:
			'From memory: typical background chloride of new concrete, % by mass of binder; not checked.'
	},
	criticalContent: {
		value: 0.6,
		source:
			'fib Bulletin 34 (2006), B.2.2: mean critical chloride content 0.6 % by mass of binder for uncoated steel — from memory, not checked against the bulletin.'
	},
	dM2PerS: {
		value: 1.0e-12,
		source:
			'From memory: apparent diffusion coefficient of 20–30-year-old in-situ concrete, taken constant (no ageing, α = 0); not checked. Fit it to a measured chloride profile.'
	},
	dCov: {
		value: 0.2,
		source: 'fib Bulletin 34 (2006) uses a normal D_RCM with CoV 0.2 — from memory, not checked.'
	}
};

/** Surface chloride content C_s (% by mass of binder) per XD/XS class. */
export const CHLORIDE_DEFAULTS: Record<string, ChlorideDefaults> = {
	XD1: {
		...chlorideCommon,
		surfaceContent: {
			value: 1.0,
			source: 'From memory: airborne de-icing spray, moderate; not checked.'
		}
	},
	XD2: {
		...chlorideCommon,
		surfaceContent: {
			value: 2.0,
			source: 'From memory: wet, rarely dry, chlorides other than sea water; not checked.'
		}
	},
	XD3: {
		...chlorideCommon,
		surfaceContent: {
			value: 3.0,
			source:
				'From memory: car park decks and splash zones with de-icing salts reach 2–4 %; not checked.'
		}
	},
	XS1: {
		...chlorideCommon,
		surfaceContent: {
			value: 1.5,
			source: 'From memory: airborne sea salt, not in contact with sea water; not checked.'
		}
	},
	XS2: {
		...chlorideCommon,
		surfaceContent: { value: 3.0, source: 'From memory: permanently submerged; not checked.' }
	},
	XS3: {
		...chlorideCommon,
		surfaceContent: {
			value: 4.0,
			source: 'From memory: tidal, splash and spray zones; not checked.'
		}
	}
};

/** Seeded Monte Carlo: the same seed and sample count give the same figures every time. */
export const SIMULATION = { samples: 50_000, seed: 20_260_101 };

const positive = (what: string) =>
	z.number({ error: `${what} must be a number.` }).positive(`${what} must be above 0.`);
const share = (what: string) =>
	z
		.number({ error: `${what} must be a number.` })
		.min(0, `${what} must be at least 0.`)
		.max(1, `${what} must be at most 1.`);

export const carbonationSchema = z.object({
	kind: z.literal('carbonation'),
	kMmPerSqrtYear: positive('k').max(20, 'k above 20 mm/√year is not plausible.'),
	depthCov: share('The scatter of the carbonation depth')
});

export const chlorideSchema = z
	.object({
		kind: z.literal('chloride'),
		surfaceContent: positive('The surface chloride content').max(
			10,
			'C_s above 10 % is not plausible.'
		),
		initialContent: z.number().min(0, 'The initial chloride content must be at least 0.'),
		criticalContent: positive('The critical chloride content'),
		dM2PerS: positive('The diffusion coefficient').max(1e-9, 'D above 1e-9 m²/s is not plausible.'),
		dCov: share('The scatter of D'),
		/** Ageing exponent α of D(t) = D_ref·(t_ref/t)^α (fib Bulletin 34); absent: constant D. */
		ageingExponent: z
			.number({ error: 'The ageing exponent must be a number.' })
			.min(0, 'The ageing exponent must be at least 0.')
			.lt(1, 'The ageing exponent must be below 1.')
			.optional(),
		/** Age (years) at which D_ref was measured; needed with an ageing exponent above 0. */
		tRefYears: z
			.number({ error: 'The reference age must be a number.' })
			.positive('The reference age must be above 0 years.')
			.optional()
	})
	.refine((c) => c.initialContent < c.criticalContent && c.criticalContent < c.surfaceContent, {
		message: 'Chloride contents must rise: initial < critical < surface.',
		path: ['criticalContent']
	});

/** Parameters keyed by exposure class (e.g. "XD3"); XC* takes carbonation, XD or XS chloride. */
export const durabilityParametersSchema = z
	.record(
		z.string().regex(/^(XC[1-4]|X[DS][1-3])$/, 'An exposure class is XC1–XC4, XD1–XD3 or XS1–XS3.'),
		z.union([carbonationSchema, chlorideSchema])
	)
	.superRefine((record, context) => {
		for (const [exposure, p] of Object.entries(record)) {
			const wanted = exposure.startsWith('XC') ? 'carbonation' : 'chloride';
			if (p.kind !== wanted) {
				context.addIssue({
					code: 'custom',
					path: [exposure],
					message: `${exposure} is judged with the ${wanted} model.`
				});
			}
		}
	});

export type CarbonationParameters = z.infer<typeof carbonationSchema>;
export type ChlorideParameters = z.infer<typeof chlorideSchema>;
export type ExposureParameters = CarbonationParameters | ChlorideParameters;
export type DurabilityParameters = z.infer<typeof durabilityParametersSchema>;

/** The stated default for an exposure class; null for classes with no corrosion risk (X0, XF*, XA*). */
export function defaultParameters(exposureClass: string): ExposureParameters | null {
	const carbonation = CARBONATION_DEFAULTS[exposureClass];
	if (carbonation) {
		return {
			kind: 'carbonation',
			kMmPerSqrtYear: carbonation.k.value,
			depthCov: carbonation.depthCov.value
		};
	}
	const chloride = CHLORIDE_DEFAULTS[exposureClass];
	if (!chloride) return null;
	return {
		kind: 'chloride',
		surfaceContent: chloride.surfaceContent.value,
		initialContent: chloride.initialContent.value,
		criticalContent: chloride.criticalContent.value,
		dM2PerS: chloride.dM2PerS.value,
		dCov: chloride.dCov.value
	};
}

/** Defaults for every exposure class given, overridden by what the engineer entered. */
export function withDefaults(
	classes: readonly string[],
	entered: DurabilityParameters = {}
): DurabilityParameters {
	const out: DurabilityParameters = {};
	for (const exposure of [...new Set(classes)].sort()) {
		const chosen = entered[exposure] ?? defaultParameters(exposure);
		if (chosen) out[exposure] = chosen;
	}
	return out;
}
