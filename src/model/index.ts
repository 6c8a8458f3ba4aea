/** The model layer's public API: coefficients, the prepared (factored) model, analyses and their parts. */
export * from './analysis.ts';
export * from './availability.ts';
export * from './closed-model.ts';
export * from './closure.ts';
export * from './coefficients.ts';
export * from './graph.ts';
export * from './hawkins.ts';
export * from './multipliers.ts';
export * from './perron.ts';
export * from './plausibility.ts';
export * from './powers.ts';
export * from './prepared.ts';
export * from './rounds.ts';
export * from './spectrum.ts';
export * from './leontief.ts';
