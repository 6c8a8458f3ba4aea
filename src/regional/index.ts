/**
 * Building a county table when none exists: location-quotient regionalization of a larger table, RAS balancing
 * to known totals, and sector aggregation. Everything returns plain data; the CLI and the UI format it.
 */
export * from './quotients.ts';
export * from './employment.ts';
export * from './regionalize.ts';
export * from './ras.ts';
export * from './feasibility.ts';
export * from './aggregate.ts';
export * from './matrix-csv.ts';
export * from './balance-table.ts';
export * from './sample.ts';
export * from './plausibility.ts';
