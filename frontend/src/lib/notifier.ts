/** A small store of short messages, shown one at a time by the app's snackbar. */
export type NoticeSeverity = 'success' | 'info' | 'warning' | 'error';

/** A button on the message, e.g. "Undo": pressing it closes the message and runs `onAction`. */
export interface NoticeAction {
  label: string;
  onAction: () => void;
}

export interface Notice {
  id: number;
  message: string;
  severity: NoticeSeverity;
  action?: NoticeAction;
}

type Listener = () => void;

let queue: readonly Notice[] = [];
let nextId = 1;
const listeners = new Set<Listener>();

function emit(): void {
  for (const listener of listeners) listener();
}

/** Queues a message for the snackbar, optionally with one action button. */
export function notify(message: string, severity: NoticeSeverity = 'info', action?: NoticeAction): void {
  queue = [...queue, { id: nextId++, message, severity, ...(action && { action }) }];
  emit();
}

/** The message on screen now, or null. */
export function currentNotice(): Notice | null {
  return queue[0] ?? null;
}

/** Removes a message once the snackbar has closed it. */
export function dismissNotice(id: number): void {
  const next = queue.filter((n) => n.id !== id);
  if (next.length === queue.length) return;
  queue = next;
  emit();
}

export function subscribeToNotices(listener: Listener): () => void {
  listeners.add(listener);
  return () => {
    listeners.delete(listener);
  };
}

/** Empties the queue; for tests and sign-out. */
export function clearNotices(): void {
  queue = [];
  emit();
}
