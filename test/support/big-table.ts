/** Invented tables generated at test time (no real place or data). */

/** An invented, balanced, productive table of n sectors (seeded, so every run sees the same file). */
export function bigTable(n: number): string {
  let seed = 20261201;
  const rnd = () => { seed = (seed * 1103515245 + 12345) % 2147483648; return seed / 2147483648; };
  const s = Array.from({ length: n }, (_, i) => `Sector ${i + 1}`);
  const x = s.map(() => Math.round(1000 + rnd() * 9000));
  const Z = s.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (rnd() < 0.01) Z[i]![j] = Math.round(rnd() * 2 * x[j]!) / 100;
  const lines = [['thousand dollars', ...s, 'Households', 'Exports', 'Total output'].join(',')];
  const sold = Z.map((r) => r.reduce((a, b) => a + b, 0));
  const bought = s.map((_, j) => Z.reduce((a, r) => a + r[j]!, 0));
  const out = s.map((_, i) => Math.max(x[i]!, sold[i]! * 1.5, bought[i]! * 1.5));
  for (let i = 0; i < n; i++) {
    const hh = (out[i]! - sold[i]!) * 0.4;
    lines.push([s[i], ...Z[i]!, hh, out[i]! - sold[i]! - hh, out[i]].join(','));
  }
  const lab = s.map((_, j) => (out[j]! - bought[j]!) * 0.55);
  lines.push(['Compensation of employees', ...lab, '', '', ''].join(','));
  lines.push(['Other value added', ...s.map((_, j) => out[j]! - bought[j]! - lab[j]!), '', '', ''].join(','));
  lines.push(['Employment', ...out.map((v) => Math.round(v / 100)), '', '', ''].join(','));
  return lines.join('\n');
}
