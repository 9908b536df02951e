/** Risk of approved assessments: per population, per asset, ranked across a portfolio. */
export * from './levels';
export * from './parameters';
export * from './model';
export * from './compute';
export * from './measured';
export { measuredProvenance, sensitivityWords } from './measuredProvenance';
export * from './annex';
export * from './summary';
export * from './source';
export * from './store';
export * from './portfolio';
export * from './view';
export * from './form';
