/**
 * Property tests draw from one fixed seed unless a test names its own (`FC_SEED` overrides it,
 * to explore): a CI run must not pass or fail by the draw. Explore locally with
 * `FC_SEED=$RANDOM npm run test:unit`; a failure found that way becomes an `examples` entry of its
 * test (tests/unit/analysis/countedAssessment.test.ts has two).
 */
import fc from 'fast-check';

fc.configureGlobal({ seed: Number(process.env.FC_SEED ?? 20261204) });
