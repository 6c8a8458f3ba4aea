/**
 * Peak memory of one job measured in a fresh process (so the high-water mark is not inflated by the comparison
 * libraries run in the parent): prints {"baselineMB", "peakMB"} from process.resourceUsage().maxRSS.
 * Usage: tsx test/bench/memory-child.ts inverse N
 */
import { luFactor, luInverse } from '../../src/linalg/index.ts';
import { leontiefMatrix } from './matrices.ts';

const [task, nArg] = process.argv.slice(2);
const n = Number(nArg);
const baselineMB = process.resourceUsage().maxRSS / 1024;
if (task === 'inverse') {
  const m = leontiefMatrix(n);
  const inv = luInverse(luFactor(m, n));
  if (!(inv[0]! > 0)) process.exitCode = 1;
} else {
  process.stderr.write(`unknown task ${task}\n`);
  process.exit(2);
}
process.stdout.write(JSON.stringify({ baselineMB, peakMB: process.resourceUsage().maxRSS / 1024 }) + '\n');
