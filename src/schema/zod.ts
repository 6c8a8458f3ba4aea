/**
 * The one way the engine imports zod. The desktop window's Content-Security-Policy forbids eval; without
 * `jitless`, zod probes `new Function` on first use and the refused probe is reported as a CSP violation in the
 * page or the worker. Every module that validates with zod imports `z` from here, so the setting always applies.
 */
import { z } from 'zod';

z.config({ jitless: true });

export { z };
