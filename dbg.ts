import { readFileSync } from 'node:fs';
import { importTable } from './src/table/index.ts';
import { analyzeTable } from './src/model/analysis.ts';
const t = importTable(readFileSync('sample-data/fernhollow-county.csv','utf8'), { fileName: 'fernhollow-county.csv' });
const t0 = performance.now();
const an = analyzeTable(t, { inverse: true });
console.log(performance.now() - t0, 'ms');
console.log(JSON.stringify({ v: { ...an.viability, spectrum: an.viability.spectrum?.slice(0,4), rightPerronVector: undefined, leftPerronVector: undefined, hawkinsSimonDetail: undefined }, out: an.multipliers.output, inc: an.multipliers.income, w: an.warnings, checks: an.checks, series: {...an.series, certificate: undefined} }, null, 0));
