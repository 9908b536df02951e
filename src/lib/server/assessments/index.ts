/** Assessment snapshots and their sign-off; the risk view and the report read AssessmentSnapshot. */
export * from './snapshot';
export * from './service';
export * from './present';
export * from './input';
