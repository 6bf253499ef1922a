/** Stopping powers of light ions: NIST PSTAR/ASTAR tables, Bragg's rule, same-velocity scaling, Bethe above the tables, user tables. */
export * from './stopping-result.js';
export * from './stopping-table.js';
export * from './stopping-power.js';
export * from './user-stopping-table.js';
export * from './nist-star-materials.js';
export * from './composition-fractions.js';
export * from './interpolate-log-log.js';
export * from './bethe-stopping.js';
export * from './same-velocity-scaling.js';
export * from './read-stopping-table.js';
export * from './mass-stopping-to-atomic.js';
export { NIST_STAR_EDITION } from './nist-star-tables.js';
