/**
 * The worker's side of the Scenarios screen's classification bridge: files whose sector column holds codes of an
 * outside classification, read through a bridge file `code,sector[,share]` by the study layer (src/study bridges.ts,
 * the same functions as the CLI's --bridge). Stateless apart from the table in use, whose sectors the bridge must name.
 */
import { bridgeSummary, readBridge, shockFromFile, utf8Bytes, type Bridge, type BridgeSummary, type PreparedStudy } from '../../src/study/index.ts';
import type { RegionalFile } from './regional.ts';
import type { ScenarioDraft } from './protocol.ts';

/** The bridge as the user picked it, read against the sectors of the table in use (located refusals). */
export function bridgeOf(file: RegionalFile, sectors: readonly string[]): Bridge {
  return readBridge({ bytes: utf8Bytes(file.text), fileName: file.fileName }, sectors);
}

export function bridgeApi(current: () => PreparedStudy) {
  return {
    /** Read a bridge against the table in use: what it covers, or its refusal. */
    checkBridge(args: { bridge: RegionalFile }): BridgeSummary {
      const sectors = current().study.table.sectors;
      return bridgeSummary(bridgeOf(args.bridge, sectors), sectors);
    },
    /**
     * A shock file as a new scenario, its sector column read as codes through the bridge when one is given. The lines
     * lose their file line: they are the screen's lines from now on, numbered as shown.
     */
    readShockFile(args: { text: string; fileName: string; bridge: RegionalFile | null }): ScenarioDraft {
      const sectors = current().study.table.sectors;
      const s = shockFromFile(args.text, args.fileName, args.bridge ? bridgeOf(args.bridge, sectors) : null);
      return { ...s, phases: s.phases.map((p) => ({ ...p, lines: p.lines.map(({ origin: _origin, ...l }) => l) })) };
    },
  };
}
