import { describe, expect, it } from 'vitest';
import { pushHistory, redoHistory, startHistory, undoHistory, MAX_UNDO_STEPS } from '../undo-history';

describe('undo history', () => {
  it('undoes and redoes steps in order, and a new step drops what was undone', () => {
    let h = startHistory('a');
    h = pushHistory(h, 'b');
    h = pushHistory(h, 'c');
    h = undoHistory(h);
    expect(h.present).toBe('b');
    h = undoHistory(h);
    expect(h.present).toBe('a');
    expect(undoHistory(h).present).toBe('a');
    h = redoHistory(h);
    expect(h.present).toBe('b');
    h = pushHistory(h, 'd');
    expect(h.future).toEqual([]);
    expect(redoHistory(h).present).toBe('d');
    expect(undoHistory(h).present).toBe('b');
  });

  it(`keeps the last ${MAX_UNDO_STEPS} steps`, () => {
    let h = startHistory(0);
    for (let i = 1; i <= MAX_UNDO_STEPS + 5; i++) h = pushHistory(h, i);
    expect(h.past.length).toBe(MAX_UNDO_STEPS);
    expect(h.past[0]).toBe(5);
  });
});
