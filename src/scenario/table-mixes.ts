/** Spending mixes read from the table's final-demand columns: each column's positive entries as shares. */
import type { IOTable } from '../table/index.ts';
import type { SpendingMix } from './types.ts';

/** The name of the mix of a final-demand column. */
export function tableMixName(column: string): string {
  return `Table column: ${column}`;
}

export function mixesOfTable(t: IOTable): SpendingMix[] {
  return [...t.householdConsumption, ...t.otherFinalDemand].flatMap((col) => {
    let sum = 0;
    for (let i = 0; i < t.n; i++) sum += Math.max(0, col.values[i]!);
    if (!(sum > 0)) return [];
    const shares = t.sectors.map((sector, i) => ({ sector, share: Math.max(0, col.values[i]!) / sum })).filter((x) => x.share > 0);
    return [{ name: tableMixName(col.label), shares }];
  });
}
