/**
 * Undo/redo by snapshots: each edit records the state before it. Scenario lists are small (tens of lines),
 * so whole-state JSON snapshots are simpler and safer than inverse operations.
 */
export class History<T> {
  private past: string[] = [];
  private future: string[] = [];
  constructor(private readonly limit = 200) {}

  /** Call before applying an edit, with the state as it is now. */
  record(current: T): void {
    this.past.push(JSON.stringify(current));
    if (this.past.length > this.limit) this.past.shift();
    this.future = [];
  }

  undo(current: T): T | null {
    const prev = this.past.pop();
    if (prev === undefined) return null;
    this.future.push(JSON.stringify(current));
    return JSON.parse(prev) as T;
  }

  redo(current: T): T | null {
    const next = this.future.pop();
    if (next === undefined) return null;
    this.past.push(JSON.stringify(current));
    return JSON.parse(next) as T;
  }

  get canUndo(): boolean { return this.past.length > 0; }
  get canRedo(): boolean { return this.future.length > 0; }

  clear(): void {
    this.past = [];
    this.future = [];
  }
}
