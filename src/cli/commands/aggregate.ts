/**
 * `roundwise aggregate TABLE.csv --groups GROUPS.csv`: merges sectors into groups (src/regional/aggregate.ts) and
 * reports the aggregation bias.
 */
import { CAUTIONS, aboutText, reportFiles, importTable, writeTableCsv, aggregateTable, parseGroupMapping, type AggregationResult } from '../../study/index.ts';
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { defineCommand } from '../command.ts';
import { num, textTable } from '../terminal.ts';

function biasRows(res: AggregationResult) {
  return res.bias.map((b) => {
    const m = b.memberMultipliers;
    return {
      group: b.group,
      members: b.members,
      lowest: m ? Math.min(...m) : null,
      highest: m ? Math.max(...m) : null,
      weighted: b.weightedMemberMultiplier,
      group_: b.groupMultiplier,
    };
  });
}

export const aggregate = defineCommand({
  name: 'aggregate',
  summary: 'merge sectors into groups (flows, outputs, value added, final demand and jobs summed; coefficients recomputed) and report the aggregation bias',
  positional: { name: 'TABLE.csv', help: 'the detailed table, in any layout roundwise analyze reads' },
  options: {
    groups: { type: 'string', value: 'GROUPS.csv', required: true, help: 'CSV sector,group: one line per sector of the table (header optional); groups keep the order in which they first appear' },
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the table\'s rows and columns' },
    ...TABLE_DIALECT_OPTIONS,
  },
  outHelp: 'write aggregated-table.csv (reads back with roundwise analyze) and aggregation-bias.csv, each with an .about.txt',
  notes: [
    'Aggregation bias: a merged sector has one average recipe; the report shows, per group, the spread of the members\'',
    'Type I output multipliers against the group\'s.',
  ],
  async run({ input, values }, ctx) {
    const roles = ctx.roleMap(values.map);
    const file = ctx.input(input);
    const table = importTable(file.text, { fileName: input, ...tableDialect(values), ...(roles ? { roles } : {}) });
    const res = aggregateTable(table, parseGroupMapping(ctx.input(values.groups).text, values.groups));
    const rows = biasRows(res);
    const meta = {
      tableName: res.table.name,
      sourceFile: file.name,
      sourceHash: file.sha256,
      modelType: 'sector aggregation (flows summed, coefficients recomputed)',
      date: ctx.date,
      moneyUnit: res.table.moneyUnit,
      notes: res.notes,
    };
    const f = (v: number | null) => (v === null ? 'n/a' : num(v, 4));
    return {
      summary: () => [
        `Aggregated ${table.n} sectors into ${res.groups.length} groups.`,
        '',
        textTable(['Group', 'Members', 'Member multipliers', 'Weighted', 'Group'], rows.map((r) => [r.group, String(r.members.length), `${f(r.lowest)}–${f(r.highest)}`, f(r.weighted), f(r.group_)])),
        '',
        ...res.notes.slice(1),
        '',
        'Cautions:',
        ...CAUTIONS.map((c) => `- ${c}`),
        '',
      ].join('\n'),
      json: () => ({ sectors: res.groups, groups: res.groups, members: res.members, bias: res.bias, notes: res.notes, cautions: CAUTIONS }),
      reports: [
        { name: 'aggregated-table.csv', content: writeTableCsv(res.table) },
        { name: 'aggregated-table.about.txt', content: aboutText({ ...meta, title: 'Aggregated input-output table' }) },
        ...reportFiles('aggregation-bias', { ...meta, title: 'Aggregation bias: Type I output multipliers of members and groups' }, [
          ['Group', 'Members', 'Lowest member multiplier', 'Highest member multiplier', 'Output-weighted member multiplier', 'Group multiplier'],
          ...rows.map((r) => [r.group, r.members.join('; '), r.lowest, r.highest, r.weighted, r.group_]),
        ]),
      ],
    };
  },
});
