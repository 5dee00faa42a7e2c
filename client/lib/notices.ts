/**
 * The notice area's store: a short list of messages (API errors, confirmations) that the
 * `<NoticeArea>` shows and the user dismisses. A tiny external store read with
 * `useSyncExternalStore`, so anything (the query client's error handlers included) can post.
 */
import { useSyncExternalStore } from 'react';

export type NoticeTone = 'error' | 'success' | 'info';

export interface Notice {
  id: number;
  tone: NoticeTone;
  title: string;
  message?: string;
}

type Listener = () => void;

/**
 * `limit`: the most notices kept (the oldest go first). `settleMs`: how long a success or info
 * notice stays before it goes by itself; errors stay until dismissed (0 keeps everything).
 */
export function createNoticeStore({ limit = 4, settleMs = 6000 }: { limit?: number; settleMs?: number } = {}) {
  let notices: readonly Notice[] = [];
  let nextId = 1;
  const listeners = new Set<Listener>();
  const emit = () => listeners.forEach((listener) => listener());

  const dismiss = (id: number) => {
    const next = notices.filter((n) => n.id !== id);
    if (next.length === notices.length) return;
    notices = next;
    emit();
  };

  const post = (notice: Omit<Notice, 'id'>): number => {
    // The same message twice in a row (a retried query) shows once.
    const last = notices[notices.length - 1];
    if (last && last.title === notice.title && last.message === notice.message) return last.id;
    const id = nextId++;
    notices = [...notices, { ...notice, id }].slice(-limit);
    emit();
    if (settleMs > 0 && notice.tone !== 'error') setTimeout(() => dismiss(id), settleMs);
    return id;
  };

  return {
    subscribe(listener: Listener) {
      listeners.add(listener);
      return () => void listeners.delete(listener);
    },
    list: () => notices,
    post,
    dismiss,
    clear() {
      if (!notices.length) return;
      notices = [];
      emit();
    },
  };
}

export type NoticeStore = ReturnType<typeof createNoticeStore>;

export const notices = createNoticeStore();

export function useNotices(store: NoticeStore = notices): readonly Notice[] {
  return useSyncExternalStore(store.subscribe, store.list, store.list);
}
