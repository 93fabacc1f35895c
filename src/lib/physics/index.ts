/**
 * Public surface of the physics core (DESIGN.md §3). Pure TypeScript, SI units, no I/O.
 */
export * from './constants';
export * from './atmosphere';
export * from './reasons';
export * from './orbits';
export * from './rocket';
export * from './budget';
export * from './feasibility';
export * from './evaluate';
export * from './drag';
export * from './atmosphere-table';
export * from './ascent';
export * from './ascent-sizing';
