/** Populations: gathered with SQL, judged by the engine. The seam the risk view, reports and API call. */
export * from './detail';
export * from './mixture';
export * from './groups';
export * from './query';
export * from './requirement';
export * from './service';
export type { MemberSpec } from './gather';
export * from './member';
export * from './selection';
export * from './lowAreas';
export * from './custom';
export * from './calibration';
