/** Errors with a location, warnings, and their one-line wording (base layer). */
export * from './errors.ts';
