/** Assessment snapshots and their sign-off. Issue 7 reads AssessmentSnapshot. */
export * from './snapshot';
export * from './service';
export * from './present';
export * from './input';
