// Undo/redo of scenario edits: snapshots restore exactly, a new edit clears the redo list.
import { describe, expect, it } from 'vitest';
import { History } from '../../renderer/state/history.ts';

describe('undo history', () => {
  it('undoes and redoes edits in order', () => {
    const h = new History<{ v: number[] }>();
    let s = { v: [1] };
    h.record(s); s = { v: [1, 2] };
    h.record(s); s = { v: [1, 2, 3] };
    expect(h.canUndo).toBe(true);
    s = h.undo(s)!; expect(s).toEqual({ v: [1, 2] });
    s = h.undo(s)!; expect(s).toEqual({ v: [1] });
    expect(h.undo(s)).toBeNull();
    s = h.redo(s)!; expect(s).toEqual({ v: [1, 2] });
    h.record(s); s = { v: [9] };
    expect(h.canRedo).toBe(false);
    s = h.undo(s)!; expect(s).toEqual({ v: [1, 2] });
  });

  it('keeps at most its limit of steps', () => {
    const h = new History<number>(3);
    for (let k = 0; k < 10; k++) h.record(k);
    let s = 10, steps = 0;
    while (h.canUndo) { s = h.undo(s)!; steps++; }
    expect(steps).toBe(3);
    expect(s).toBe(7);
  });
});
