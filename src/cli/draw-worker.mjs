// Draw helper thread (src/cli/draw-pool.ts): loads the engine part, draw-engine, from the bundle when it sits beside
// this file (dist/cli/), else from the sources through tsx (a checkout). Plain JavaScript so a worker starts without
// the TypeScript loader.
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';

const bundled = new URL('./draw-engine.mjs', import.meta.url);
if (existsSync(fileURLToPath(bundled))) {
  await import(bundled.href);
} else {
  const { register } = await import('tsx/esm/api');
  register();
  await import(new URL('./draw-engine.ts', import.meta.url).href);
}
