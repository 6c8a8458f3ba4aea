/** zod, configured for the desktop CSP (see zod.ts); the only way engine code imports it. */
export { z } from './zod.ts';
