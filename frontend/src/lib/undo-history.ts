import { elementAt } from '@quietglass/shared';
import { useCallback, useState } from 'react';

/** Most steps kept for undo. */
export const MAX_UNDO_STEPS = 200;

export interface History<T> {
  past: T[];
  present: T;
  future: T[];
}

export function startHistory<T>(present: T): History<T> {
  return { past: [], present, future: [] };
}

/** A new present: the old one can be undone to, and what was undone cannot be redone any more. */
export function pushHistory<T>(history: History<T>, next: T): History<T> {
  if (Object.is(next, history.present)) return history;
  return { past: [...history.past, history.present].slice(-MAX_UNDO_STEPS), present: next, future: [] };
}

export function undoHistory<T>(history: History<T>): History<T> {
  if (history.past.length === 0) return history;
  return {
    past: history.past.slice(0, -1),
    present: elementAt(history.past, history.past.length - 1, 'the undo steps'),
    future: [history.present, ...history.future],
  };
}

export function redoHistory<T>(history: History<T>): History<T> {
  if (history.future.length === 0) return history;
  return {
    past: [...history.past, history.present],
    present: elementAt(history.future, 0, 'the redo steps'),
    future: history.future.slice(1),
  };
}

/** A value with undo and redo: every `set` is one step. */
export function useUndoable<T>(initial: () => T) {
  const [history, setHistory] = useState(() => startHistory(initial()));
  const set = useCallback((next: T) => setHistory((h) => pushHistory(h, next)), []);
  const undo = useCallback(() => setHistory(undoHistory), []);
  const redo = useCallback(() => setHistory(redoHistory), []);
  return {
    value: history.present,
    set,
    undo,
    redo,
    canUndo: history.past.length > 0,
    canRedo: history.future.length > 0,
  };
}
