/**
 * `roundwise aggregate TABLE.csv --groups GROUPS.csv [--map MAP.json] [--json] [--out DIR]`
 * Merges sectors into groups (src/regional/aggregate.ts) and reports the aggregation bias.
 */
import { CAUTIONS, aboutText, reportFiles } from '../../report/index.ts';
import { importTable, writeTableCsv } from '../../table/index.ts';
import { aggregateTable, parseGroupMapping, type AggregationResult } from '../../regional/index.ts';
import type { CliIO } from '../io.ts';
import { num, parseCommandArgs, readInput, readRoleMap, requireOne, requireOption, sha256, textTable, writeAll } from './regional-shared.ts';

export const USAGE = 'roundwise aggregate TABLE.csv --groups GROUPS.csv [--map MAP.json] [--json] [--out DIR]';

const HELP = `${USAGE}

Merges sectors into groups: flows, outputs, value added, final demand and jobs are summed; coefficients are recomputed.
  TABLE.csv           the detailed table, in any layout roundwise analyze reads
  --groups GROUPS     CSV sector,group: one line per sector of the table (header optional); groups keep the order
                      in which they first appear
  --map MAP.json      role overrides for the table's rows and columns
  --json              print groups, members and the aggregation-bias figures as one JSON object
  --out DIR           write aggregated-table.csv (reads back with roundwise analyze) and aggregation-bias.csv,
                      each with an .about.txt
Aggregation bias: a merged sector has one average recipe; the report shows, per group, the spread of the members'
Type I output multipliers against the group's.
`;

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

export async function run(args: string[], io: CliIO): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    groups: { type: 'string' },
    map: { type: 'string' },
    json: { type: 'boolean' },
    out: { type: 'string' },
    help: { type: 'boolean', short: 'h' },
  }, USAGE);
  if (values.help) {
    io.stdout(HELP);
    return 0;
  }
  const tablePath = requireOne(positionals, 'table', USAGE);
  const groupsPath = requireOption(values.groups, 'groups', USAGE);
  const roles = readRoleMap(values.map);
  const text = readInput(tablePath);
  const table = importTable(text, { fileName: tablePath, ...(roles ? { roles } : {}) });
  const res = aggregateTable(table, parseGroupMapping(readInput(groupsPath), groupsPath));
  const rows = biasRows(res);

  let files: string[] | undefined;
  if (values.out) {
    const meta = {
      tableName: res.table.name,
      sourceFile: tablePath,
      sourceHash: sha256(text),
      modelType: 'sector aggregation (flows summed, coefficients recomputed)',
      date: new Date().toISOString(),
      moneyUnit: res.table.moneyUnit,
      notes: res.notes,
    };
    files = writeAll(values.out, [
      { name: 'aggregated-table.csv', content: writeTableCsv(res.table) },
      { name: 'aggregated-table.about.txt', content: aboutText({ ...meta, title: 'Aggregated input-output table' }) },
      ...reportFiles('aggregation-bias', { ...meta, title: 'Aggregation bias: Type I output multipliers of members and groups' }, [
        ['Group', 'Members', 'Lowest member multiplier', 'Highest member multiplier', 'Output-weighted member multiplier', 'Group multiplier'],
        ...rows.map((r) => [r.group, r.members.join('; '), r.lowest, r.highest, r.weighted, r.group_]),
      ]),
    ]);
  }
  if (values.json) {
    io.stdout(`${JSON.stringify({
      sectors: res.groups,
      groups: res.groups,
      members: res.members,
      bias: res.bias,
      notes: res.notes,
      cautions: CAUTIONS,
      ...(files ? { files } : {}),
    })}\n`);
  } else {
    const f = (v: number | null) => (v === null ? 'n/a' : num(v, 4));
    io.stdout([
      `Aggregated ${table.n} sectors into ${res.groups.length} groups.`,
      '',
      textTable(['Group', 'Members', 'Member multipliers', 'Weighted', 'Group'], rows.map((r) => [r.group, String(r.members.length), `${f(r.lowest)}–${f(r.highest)}`, f(r.weighted), f(r.group_)])),
      '',
      ...res.notes.slice(1),
      '',
      'Cautions:',
      ...CAUTIONS.map((c) => `- ${c}`),
      ...(files ? ['', `Wrote ${files.join(', ')}`] : []),
      '',
    ].join('\n'));
  }
  return 0;
}
