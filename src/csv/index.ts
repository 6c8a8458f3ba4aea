/** CSV writing shared by reports and written tables (base layer: imports nothing from the engine). */
export * from './write.ts';
