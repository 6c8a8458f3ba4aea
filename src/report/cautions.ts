/**
 * The usual cautions of input–output analysis (after Miller & Blair 2009, ch. 2 §2.7 and ch. 6, and common practice),
 * shown with every result and written into every report.
 */
export const CAUTIONS: readonly string[] = [
  'Estimates, not forecasts: input–output results assume fixed production recipes (constant technical coefficients), no supply limits and no price changes.',
  'Constant returns: every extra unit of demand is assumed to need the same inputs as the average of the base year; large shocks and new technologies break this.',
  'No displacement: the model does not know whether new activity replaces existing local activity or attracts workers from elsewhere.',
  'Type II (household-closed) effects assume local households re-spend income in the base-year pattern and tend to overstate induced effects.',
  'Regional tables estimated from national ones (location quotients) carry extra uncertainty; leakage to imports is often understated.',
  'Employment effects are jobs (head count or full-time equivalents as in the source table), not net new hires.',
  'Results support, not replace, the judgement of qualified analysts; check the table and the assumptions before quoting figures.',
];
