/**
 * FOR THE WORKSPACE ENGINEER:
 *   const { result, path, error, pending } = useAnalysis(design);
 * Re-analyses whenever the design's content changes (a new object with the same content is not
 * re-analysed, so passing a freshly built design on every render is safe). Newest request wins; a
 * superseded one is never shown.
 * With a `feed` (useRoomDesign's), each new design goes to the engine synchronously from the
 * document update that produced it, not after React has rendered it; the render's design, being the
 * same content, is then not requested again.
 * `error` is a sentence for the user (a DesignError message); while there is an error the last good
 * result stays available so the chart does not blank out.
 */
import { useCallback, useEffect, useMemo, useRef, useSyncExternalStore } from 'react';
import { flushSync } from 'react-dom';
import type { Design } from '../../../../shared/rf/design';
import { engineErrorMessage, getEngineClient, type EngineClient } from './engine-client';
import type { AnalysisResult, ImpedancePath } from './engine-types';
import { markStage, noteResultSource } from './draw-marks';
import { createLatestScheduler } from './latest-scheduler';
import type { DesignFeed } from '../collab/use-room-design';

export interface AnalysisState {
  result: AnalysisResult | null;
  path: ImpedancePath | null;
  error: string | null;
  pending: boolean;
}

/** The newest analysis state, readable by any component without re-rendering the screen around it. */
export interface AnalysisStore {
  get(): AnalysisState;
  subscribe(listener: () => void): () => void;
}

const IDLE: AnalysisState = { result: null, path: null, error: null, pending: false };

function createAnalysisStore(): AnalysisStore & { set(next: AnalysisState | ((s: AnalysisState) => AnalysisState)): void } {
  let state = IDLE;
  const listeners = new Set<() => void>();
  return {
    get: () => state,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    set(next) {
      const value = typeof next === 'function' ? next(state) : next;
      if (value === state) return;
      state = value;
      for (const l of listeners) l();
    },
  };
}

/** The store's state in a component (re-renders that component only when it changes). */
export function useAnalysisState(store: AnalysisStore): AnalysisState {
  return useSyncExternalStore(store.subscribe, store.get, store.get);
}

export function useAnalysis(design: Design | null, client: EngineClient = getEngineClient(), feed?: DesignFeed): AnalysisState {
  return useAnalysisState(useAnalysisStore(design, client, feed));
}

/**
 * Runs the live analysis like useAnalysis but does not subscribe the calling component: the
 * workspace hands the store to the chart, the plot and the figures, so a result re-renders only them.
 */
export function useAnalysisStore(design: Design | null, client: EngineClient = getEngineClient(), feed?: DesignFeed): AnalysisStore {
  const scheduler = useMemo(() => createLatestScheduler((d: Design) => client.analyze(d)), [client]);
  const store = useMemo(() => createAnalysisStore(), []);
  const setState = store.set;
  const alive = useRef(true);
  /** content of the newest design sent to the engine */
  const sentKey = useRef<string | null>(null);
  /** true once the feed has delivered: from then on it alone sends (a render may show an older design) */
  const fed = useRef(false);

  useEffect(() => {
    alive.current = true;
    return () => {
      alive.current = false;
      sentKey.current = null;
      scheduler.cancel();
    };
  }, [scheduler]);

  /**
   * Send `design` unless the same content went last; its result draws at once (not on a later task).
   * Returns a promise settled once that result is drawn (or superseded), for the design feed.
   */
  const send = useCallback(
    (design: Design, key: string): Promise<void> | undefined => {
      if (key === sentKey.current) return undefined;
      sentKey.current = key;
      markStage('requested', scheduler.issued + 1);
      return scheduler.request(design).then((outcome) => {
        if (outcome.status !== 'stale') markStage('analysed', outcome.seq);
        if (!alive.current || outcome.status === 'stale') return;
        const pending = scheduler.busy;
        if (outcome.status === 'done') {
          noteResultSource(outcome.value.result, outcome.seq, design);
          flushSync(() => setState({ result: outcome.value.result, path: outcome.value.path, error: null, pending }));
        } else flushSync(() => setState((s) => ({ ...s, error: engineErrorMessage(outcome.error), pending })));
      });
    },
    [scheduler, setState],
  );

  useEffect(() => {
    if (!feed) return;
    const stop = feed.subscribe((d) => {
      if (!alive.current) return undefined;
      fed.current = true;
      return send(d, JSON.stringify(d));
    });
    return () => {
      stop();
      fed.current = false;
    };
  }, [feed, send]);

  // Content, not identity, decides whether to re-analyse.
  const key = useMemo(() => (design ? JSON.stringify(design) : ''), [design]);
  const current = useRef(design);
  current.current = design;

  useEffect(() => {
    const design = current.current;
    if (!design) {
      scheduler.cancel();
      sentKey.current = null;
      fed.current = false;
      setState(IDLE);
      return;
    }
    if (!fed.current) send(design, key);
    // (a request sent from the feed may have delivered already)
    const pending = scheduler.busy;
    setState((s) => (s.pending === pending ? s : { ...s, pending }));
  }, [key, scheduler, send, setState]);

  return store;
}
