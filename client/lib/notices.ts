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

export function createNoticeStore(limit = 4) {
  let notices: readonly Notice[] = [];
  let nextId = 1;
  const listeners = new Set<Listener>();
  const emit = () => listeners.forEach((listener) => listener());

  return {
    subscribe(listener: Listener) {
      listeners.add(listener);
      return () => void listeners.delete(listener);
    },
    list: () => notices,
    post(notice: Omit<Notice, 'id'>): number {
      const id = nextId++;
      // The same message twice in a row (a retried query) shows once.
      const last = notices[notices.length - 1];
      if (last && last.title === notice.title && last.message === notice.message) return last.id;
      notices = [...notices, { ...notice, id }].slice(-limit);
      emit();
      return id;
    },
    dismiss(id: number) {
      const next = notices.filter((n) => n.id !== id);
      if (next.length === notices.length) return;
      notices = next;
      emit();
    },
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
