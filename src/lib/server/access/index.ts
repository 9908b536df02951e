/**
 * Who may do what, and see which records, written once: the role × action policy (policy.ts)
 * and one visibility rule per record kind. Everything here throws domain errors only; the route
 * layer (src/lib/server/web) answers them.
 */
export * from './visibility';
export * from './assessment';
export { ACTIONS, PERMISSIONS, can, type Action, type Actor } from '../policy';
