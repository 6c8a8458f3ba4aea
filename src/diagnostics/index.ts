/** Errors with a location, warnings, their one-line wording, and text from files made visible (base layer). */
export * from './errors.ts';
export * from './visible.ts';
