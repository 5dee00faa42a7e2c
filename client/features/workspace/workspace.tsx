/**
 * The room workspace: the screen RF engineers live in during a call. The Smith chart large on the
 * left at the full height of the main area, the sweep plot over the chain canvas beside it (both
 * dividers draggable and keyboard-operable), and a side panel with the selected element, the
 * load, band and port, the figures, the match finder, refine and the yield run, and who is in the
 * room. Everything is derived from the room's shared document, so every collaborator's edit shows
 * at once; an observer sees it all live with no editing control.
 */
import { memo, useCallback, useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { presenceColour } from '../../../shared/collab/presence';
import type { ViewState } from '../../../shared/collab/events';
import type { ElementKind } from '../../../shared/rf/design';
import type { ESeries } from '../../../shared/rf/eseries';
import { paths } from '../../config/paths';
import { queryKeys } from '../../lib/query-keys';
import { useMe } from '../auth/api/get-me';
import { getEngineClient } from './analysis/engine-client';
import {
  useAnalysisState,
  useAnalysisStore,
  type AnalysisState,
  type AnalysisStore,
} from './analysis/use-analysis';
import { ChainCanvas } from './chain/chain-canvas';
import { CANVAS_HEIGHT } from './chain/chain-layout';
import { elementName } from './chain/element-catalog';
import { elementDescription } from './chain/element-summary';
import { ElementPalette, StepSeriesSelect } from './chain/element-palette';
import { SmithChart, type ChartCursor, type ChartPeerSelection } from './chart/smith-chart';
import { DEFAULT_VIEW, type ChartView } from './chart/geometry';
import type { PresenceUser } from './collab/presence-state';
import { useDesignEdits } from './collab/use-design-edits';
import { useLocalUndo } from './collab/use-local-undo';
import { usePresence } from './collab/use-presence';
import { useRoomDesign } from './collab/use-room-design';
import { useRoomDoc } from './collab/use-room-doc';
import { useRoomEvents } from './collab/use-room-events';
import { FiguresPanel, FiguresSummary } from './figures/figures-panel';
import { BandForm, PortForm } from './forms/band-form';
import { LoadForm } from './forms/load-form';
import { ElementInspector } from './inspector/element-inspector';
import { smallButton } from './inspector/small-button';
import { SideTabs, type SideTab } from './layout/side-tabs';
import { SplitHandle } from './layout/split-handle';
import { useElementSize } from './layout/use-element-size';
import { useScreenHeight } from './layout/use-screen-frame';
import { SweepPlot, type SweepPlotMode } from './plot/sweep-plot';
import { PresenceAvatars, PresenceList } from './room/presence-list';
import { presenceRows } from './room/presence-rows';
import { RoomLog } from './room/room-log';
import { MatchFinderPanel, type ChainPreview } from './tools/match-finder-panel';
import { RefinePanel } from './tools/refine-panel';
import { YieldPanel, type YieldEnvelope } from './tools/yield-panel';
import { WorkspaceBanners } from './workspace-banners';

export type RoomRole = 'owner' | 'tuner' | 'observer';

export interface WorkspaceProps {
  roomId: string;
  role: RoomRole;
}

type TabKey = 'element' | 'load' | 'band' | 'figures' | 'finder' | 'refine' | 'yield' | 'room';

/** smallest Smith chart, and the least width kept for the plot and chain column beside it */
const CHART_MIN = 240;
const SIDE_COLUMN_MIN = 380;

/** a laptop screen gets a narrower side panel, so the chart and plot keep their room */
function defaultSideWidth(): number {
  return typeof window !== 'undefined' && window.innerWidth < 1600 ? 340 : 400;
}

/** Keys typed into a field keep their own undo; the room's undo is for everywhere else. */
function isTextEntry(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return (
    el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || el.isContentEditable
  );
}

export default function Workspace({ roomId, role }: WorkspaceProps) {
  const { data: me } = useMe();
  const room = useRoomDoc(roomId);
  const { design, error: docError, feed: designFeed } = useRoomDesign(room.doc, room.everSynced);
  const events = useRoomEvents(roomId, me?.id ?? null);
  const currentRole: RoomRole | null = events.roleUpdate ? events.roleUpdate.role : role;
  const lostAccess = room.status === 'denied' || currentRole === null || events.deleted;
  const editable = !lostAccess && (currentRole === 'owner' || currentRole === 'tuner');
  // A new role shows at once in the page header too (after a removal the header keeps the last one:
  // refetching the room would answer 404 and replace the screen the banner explains).
  const queryClient = useQueryClient();
  useEffect(() => {
    if (events.roleUpdate?.role) void queryClient.invalidateQueries({ queryKey: queryKeys.rooms.all });
  }, [events.roleUpdate, queryClient]);
  const editor = useLocalUndo(room.doc, me?.id ?? null);
  const edits = useDesignEdits(room.doc, editor, editable);
  const presenceUser = useMemo<PresenceUser | null>(
    () =>
      me
        ? { id: me.id, name: me.displayName, role: currentRole ?? role, color: presenceColour(me.id) }
        : null,
    [me, currentRole, role],
  );
  const presence = usePresence(room.provider, presenceUser);
  const client = getEngineClient();
  // The workspace itself does not re-render for a result: only the views below that read the store.
  const analysis = useAnalysisStore(design, client, designFeed);

  const [selected, setSelected] = useState<string | null>(null);
  const [tab, setTab] = useState<TabKey>('element');
  const [series, setSeries] = useState<ESeries | null>(null);
  const [preview, setPreview] = useState<ChainPreview | null>(null);
  const [envelope, setEnvelope] = useState<YieldEnvelope>(null);
  const [view, setView] = useState<ChartView>(DEFAULT_VIEW);
  const [plotMode, setPlotMode] = useState<SweepPlotMode>('return-loss');
  const [following, setFollowing] = useState<string | null>(null);
  const [sideWidth, setSideWidth] = useState(defaultSideWidth);
  const [chartSideSet, setChartSide] = useState<number | null>(null);
  const [chainHeightSet, setChainHeight] = useState<number | null>(null);
  const chainHeight = chainHeightSet ?? CANVAS_HEIGHT + 12;
  const [notice, setNotice] = useState<string | null>(null);
  const seriesId = useId();

  // The selection only names elements that still exist (a collaborator may delete one).
  const selectedId = design && selected && design.elements.some((e) => e.id === selected) ? selected : null;
  const selectedElement = design?.elements.find((e) => e.id === selectedId) ?? null;

  // ---- follow: take the followed member's selection and chart view ----------------------------
  const stopFollowing = useCallback(() => setFollowing(null), []);
  const selectByUser = useCallback(
    (id: string | null) => {
      setSelected(id);
      if (id) setTab('element');
      stopFollowing();
    },
    [stopFollowing],
  );
  const viewByUser = useCallback(
    (v: ChartView) => {
      setView(v);
      stopFollowing();
    },
    [stopFollowing],
  );
  useEffect(() => {
    events.follow(following);
    presence.setFollowing(following);
  }, [following]);
  const followedPeer = following ? presence.peers.find((p) => p.user.id === following) : undefined;
  useEffect(() => {
    if (!followedPeer) return;
    setSelected(followedPeer.selection);
    if (followedPeer.view) setView(followedPeer.view);
  }, [followedPeer?.selection, followedPeer?.view?.zoom, followedPeer?.view?.cx, followedPeer?.view?.cy]);
  useEffect(() => {
    const fv = events.followedView;
    if (!fv || fv.userId !== following) return;
    if (fv.view.selectedElementId !== undefined) setSelected(fv.view.selectedElementId);
    const smith = fv.view.charts?.smith;
    if (smith?.zoom !== undefined) setView({ zoom: smith.zoom, cx: smith.panX ?? 0, cy: smith.panY ?? 0 });
  }, [events.followedView, following]);

  // ---- publish what I look at ------------------------------------------------------------------
  useEffect(() => presence.setSelection(selectedId), [selectedId, presence.setSelection]);
  useEffect(() => {
    presence.setView(view);
    const v: ViewState = {
      selectedElementId: selectedId,
      charts: { smith: { zoom: view.zoom, panX: view.cx, panY: view.cy } },
      panel: tab,
    };
    events.sendView(v);
  }, [view, selectedId, tab]);

  // ---- undo / redo (this user's own edits only) -----------------------------------------------
  const undo = () => {
    editor?.undo();
    setNotice(null);
  };
  const redo = () => {
    editor?.redo();
    setNotice(null);
  };
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (!editor || !editable || isTextEntry(e.target)) return;
      const mod = e.ctrlKey || e.metaKey;
      if (!mod) return;
      const key = e.key.toLowerCase();
      if (key === 'z' && !e.shiftKey) undo();
      else if ((key === 'z' && e.shiftKey) || key === 'y') redo();
      else return;
      e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [editor, editable]);

  const say = useCallback((text: string) => setNotice(text), []);
  useEffect(() => {
    if (!notice) return;
    const t = setTimeout(() => setNotice(null), 6000);
    return () => clearTimeout(t);
  }, [notice]);

  // ---- chain edits -----------------------------------------------------------------------------
  const addElement = (kind: ElementKind) => {
    if (!design) return;
    const at = selectedId ? design.elements.findIndex((e) => e.id === selectedId) + 1 : undefined;
    const id = edits.add(kind, at);
    if (id) {
      setSelected(id);
      setTab('element');
    }
  };
  // Stable callbacks (they read the newest design through a ref), so memoised children such as the
  // chain canvas re-render only when what they show changes.
  const latestDesign = useRef(design);
  latestDesign.current = design;
  const removeEl = useCallback(
    (id: string) => {
      const current = latestDesign.current;
      if (!current) return;
      const i = current.elements.findIndex((e) => e.id === id);
      const neighbour = current.elements[i + 1] ?? current.elements[i - 1] ?? null;
      edits.remove(id);
      setSelected(neighbour?.id ?? null);
    },
    [edits],
  );
  const duplicateEl = useCallback(
    (id: string) => {
      const copy = edits.duplicate(id);
      if (copy) setSelected(copy);
    },
    [edits],
  );
  const elementActions = useMemo(
    () => ({
      setField: edits.setField,
      setFields: edits.setFields,
      tuneField: edits.tuneField,
      remove: removeEl,
      duplicate: duplicateEl,
      move: edits.move,
    }),
    [edits, removeEl, duplicateEl],
  );

  // ---- sizes -----------------------------------------------------------------------------------
  const root = useRef<HTMLDivElement>(null);
  const screenHeight = useScreenHeight(root);
  const mainBox = useRef<HTMLDivElement>(null);
  const mainSize = useElementSize(mainBox);
  const plotBox = useRef<HTMLDivElement>(null);
  const plotSize = useElementSize(plotBox);
  const chainBox = useRef<HTMLDivElement>(null);
  const chainSize = useElementSize(chainBox);
  // The chart is square and as tall as the main area (less the padding) unless resized by hand;
  // the column beside it always keeps room for a readable plot and the chain canvas.
  const chartHeight = Math.max(CHART_MIN, mainSize.height - 16);
  const chartMax = Math.max(CHART_MIN, Math.min(chartHeight, mainSize.width - 16 - 8 - SIDE_COLUMN_MIN));
  const chartSide = Math.max(CHART_MIN, Math.min(chartMax, chartSideSet ?? chartHeight));

  const cursors = useMemo<ChartCursor[]>(
    () =>
      presence.peers.flatMap((p) =>
        p.cursor?.area === 'chart'
          ? [{ userId: p.user.id, name: p.user.name, color: p.user.color, gamma: p.cursor.gamma }]
          : [],
      ),
    [presence.peers],
  );
  const peerSelections = useMemo<ChartPeerSelection[]>(
    () =>
      presence.peers.flatMap((p) =>
        p.selection
          ? [{ userId: p.user.id, name: p.user.name, color: p.user.color, elementId: p.selection }]
          : [],
      ),
    [presence.peers],
  );
  const rows = useMemo(
    () =>
      presenceRows(
        events.members,
        presence.peers,
        me ? { id: me.id, name: me.displayName, role: currentRole ?? role, selection: selectedId } : null,
      ),
    [events.members, presence.peers, me, currentRole, role, selectedId],
  );
  const others = rows.filter((r) => !r.isMe);
  const followedName = following ? (rows.find((r) => r.userId === following)?.name ?? 'a member') : null;
  const onChartCursor = useCallback(
    (g: [number, number] | null) => presence.setCursor(g ? { area: 'chart', gamma: g } : null),
    [presence],
  );
  const nameOfElement = useCallback(
    (id: string) => {
      const e = design?.elements.find((x) => x.id === id);
      return e ? elementName(e) : id;
    },
    [design],
  );

  const tabs: SideTab<TabKey>[] = [
    {
      key: 'element',
      label: 'Element',
      badge: selectedElement ? elementName(selectedElement) : null,
      badgeLabel: selectedElement ? `${elementName(selectedElement)} selected` : undefined,
    },
    { key: 'load', label: 'Load' },
    { key: 'band', label: 'Band & port' },
    { key: 'figures', label: 'Figures' },
    { key: 'finder', label: 'Match finder' },
    { key: 'refine', label: 'Refine' },
    { key: 'yield', label: 'Yield run' },
    {
      key: 'room',
      label: 'Room',
      badge: others.length ? String(others.length) : null,
      badgeLabel: `${others.length} other${others.length === 1 ? '' : 's'} here`,
    },
  ];

  const waiting = (
    <p className="text-sm text-ink-faint">
      {room.everSynced ? 'The design cannot be shown.' : 'Opening the room…'}
    </p>
  );
  const panelsLive: Record<TabKey, ReactNode> = !design
    ? {
        element: waiting,
        load: waiting,
        band: waiting,
        figures: waiting,
        finder: waiting,
        refine: waiting,
        yield: waiting,
        room: waiting,
      }
    : {
        element: (
          <div className="flex flex-col gap-4">
            {selectedElement ? (
              <ElementInspector
                design={design}
                element={selectedElement}
                editable={editable}
                series={series}
                actions={elementActions}
              />
            ) : (
              <p className="text-sm text-ink-soft">
                {design.elements.length
                  ? 'Select an element on the chain canvas or in the list below.'
                  : editable
                    ? 'No network yet. Add parts from the palette over the chain canvas, or let the match finder propose one.'
                    : 'No network yet.'}
              </p>
            )}
            <ChainList design={design} selectedId={selectedId} onSelect={selectByUser} />
            {editable && design.elements.length === 0 && (
              <button type="button" className={smallButton('primary')} onClick={() => setTab('finder')}>
                Open the match finder
              </button>
            )}
          </div>
        ),
        load: <LoadForm design={design} editable={editable} onApply={edits.applyPatch} />,
        band: (
          <div className="flex flex-col gap-5">
            <BandForm design={design} editable={editable} onApply={edits.applyPatch} />
            <PortForm design={design} editable={editable} onApply={edits.applyPatch} />
          </div>
        ),
        figures: (
          <WithAnalysis store={analysis}>
            {(a) => <FiguresPanel design={design} result={a.result} error={a.error} />}
          </WithAnalysis>
        ),
        finder: (
          <MatchFinderPanel
            design={design}
            editable={editable}
            active={tab === 'finder'}
            client={client}
            onPreview={setPreview}
            onApply={(elements, what) => {
              edits.replaceChain(elements);
              setSelected(null);
              say(`Applied ${what}. Ctrl+Z takes it back.`);
            }}
          />
        ),
        refine: (
          <RefinePanel
            design={design}
            editable={editable}
            client={client}
            onApply={(changes) => {
              edits.applyChanges(changes);
              say('Applied the refined values. Ctrl+Z takes them back.');
            }}
          />
        ),
        yield: <YieldPanel design={design} client={client} onEnvelope={setEnvelope} />,
        room: (
          <div className="flex flex-col gap-4">
            <section aria-labelledby="presence-title">
              <h3 id="presence-title" className="mb-1.5 text-sm font-bold text-ink">
                Presence
              </h3>
              <PresenceList
                rows={rows}
                followingId={following}
                onFollow={setFollowing}
                elementName={nameOfElement}
              />
            </section>
            <section aria-labelledby="log-title">
              <h3 id="log-title" className="mb-1.5 text-sm font-bold text-ink">
                Room log
              </h3>
              <RoomLog entries={events.log} />
            </section>
          </div>
        ),
      };

  // A hidden panel keeps its last rendering (and its state) until it is shown again, so a tuned
  // value re-renders only the panel in view.
  const panels = Object.fromEntries(
    (Object.keys(panelsLive) as TabKey[]).map((k) => [
      k,
      <HiddenWhileInactive key={k} active={k === tab}>
        {panelsLive[k]}
      </HiddenWhileInactive>,
    ]),
  ) as Record<TabKey, ReactNode>;

  return (
    <div
      ref={root}
      // Rounded but not clipping (no overflow-hidden): a rounded clip around the chart's, plot's and
      // chain's canvases makes the browser's compositor draw the whole workspace into an extra
      // surface on every frame (measured with bench:ui --trace: 8.8 → 3.3 ms per frame in headless
      // Chromium). The toolbar rounds its own top corners instead.
      className="flex flex-col rounded-xl border border-rule bg-card/60"
      style={{ height: screenHeight }}
      data-testid="workspace"
      data-role={currentRole ?? 'none'}
      data-synced={room.synced ? 'true' : 'false'}
    >
      {/* toolbar */}
      <div className="flex flex-wrap items-center gap-x-4 gap-y-1 rounded-t-[11px] border-b border-rule bg-card px-3 py-1.5">
        <ConnectionChip status={room.status} synced={room.synced} />
        {!editable && !lostAccess && (
          <span
            className="rounded-full bg-slate-soft px-2 py-0.5 text-[11px] font-bold text-ink-soft"
            data-testid="read-only-chip"
          >
            Watching: read-only
          </span>
        )}
        {editable && editor && (
          <span className="flex items-center gap-1" role="group" aria-label="Undo and redo your own edits">
            <button
              type="button"
              className={smallButton()}
              disabled={!editor.canUndo}
              onClick={undo}
              title="Undo your last edit (Ctrl+Z)"
            >
              Undo
            </button>
            <button
              type="button"
              className={smallButton()}
              disabled={!editor.canRedo}
              onClick={redo}
              title="Redo (Ctrl+Shift+Z)"
            >
              Redo
            </button>
          </span>
        )}
        {editable && <StepSeriesSelect id={seriesId} value={series} onChange={setSeries} />}
        <span className="min-w-0 flex-1" aria-live="polite">
          {notice && <span className="text-xs text-teal-deep">{notice}</span>}
        </span>
        {others.length > 0 && (
          <label className="flex items-center gap-1 text-xs">
            <span className="font-semibold text-ink-soft">Follow</span>
            <select
              value={following ?? ''}
              onChange={(e) => setFollowing(e.target.value || null)}
              className="rounded-md border border-rule bg-card px-1 py-0.5 text-xs"
              aria-label="Follow a member’s view"
            >
              <option value="">nobody</option>
              {others.map((r) => (
                <option key={r.userId} value={r.userId}>
                  {r.name} ({r.role})
                </option>
              ))}
            </select>
          </label>
        )}
        {followedName && (
          <span
            className="flex items-center gap-1 rounded-full bg-violet-soft px-2 py-0.5 text-[11px] font-bold text-violet-deep"
            data-testid="following-chip"
          >
            Following {followedName}
            <button type="button" className="underline" onClick={stopFollowing}>
              stop
            </button>
          </span>
        )}
        <PresenceAvatars rows={rows} />
      </div>

      <WithAnalysis store={analysis}>
        {(a) => (
          <WorkspaceBanners
            lostAccess={lostAccess}
            deleted={events.deleted}
            status={room.status}
            everSynced={room.everSynced}
            docError={docError}
            analysisError={a.error}
            hasDesign={design !== null}
          />
        )}
      </WithAnalysis>

      {design && (
        <div className="border-b border-rule bg-paper/60 px-3 py-1.5">
          <WithAnalysis store={analysis}>
            {(a) => <FiguresSummary design={design} result={a.result} pending={a.pending} />}
          </WithAnalysis>
        </div>
      )}

      <div className="flex min-h-0 flex-1">
        {/* the chart on the left at full height; the sweep plot over the chain canvas beside it */}
        <div ref={mainBox} className="flex min-w-0 flex-1 p-2">
          <div className="shrink-0" style={{ width: chartSide }} data-testid="chart-pane">
            {design && mainSize.width > 0 && (
              <WithAnalysis store={analysis}>
                {(a) => (
                  <SmithChart
                    width={chartSide}
                    height={chartHeight}
                    design={design}
                    result={a.result}
                    path={a.path}
                    selectedElementId={selectedId}
                    onSelectElement={selectByUser}
                    envelope={envelope}
                    preview={preview}
                    cursors={cursors}
                    peerSelections={peerSelections}
                    onCursorMove={onChartCursor}
                    view={view}
                    onViewChange={viewByUser}
                  />
                )}
              </WithAnalysis>
            )}
          </div>
          <SplitHandle
            orientation="vertical"
            label="Resize the Smith chart"
            value={chartSide}
            min={CHART_MIN}
            max={chartMax}
            onChange={setChartSide}
          />
          <div className="flex min-w-0 flex-1 flex-col">
            <div className="mb-1 flex items-center gap-1" role="group" aria-label="Plot">
              {(['return-loss', 'vswr'] as const).map((m) => (
                <button
                  key={m}
                  type="button"
                  aria-pressed={plotMode === m}
                  onClick={() => setPlotMode(m)}
                  className={plotMode === m ? smallButton('primary') : smallButton()}
                >
                  {m === 'return-loss' ? 'Return loss' : 'VSWR'}
                </button>
              ))}
            </div>
            <div ref={plotBox} className="relative min-h-0 flex-1 overflow-hidden" data-testid="plot-pane">
              {design && plotSize.width > 0 && (
                <div className="absolute inset-0">
                  <WithAnalysis store={analysis}>
                    {(a) => (
                      <SweepPlot
                        width={Math.max(160, plotSize.width)}
                        height={Math.max(120, plotSize.height)}
                        design={design}
                        result={a.result}
                        mode={plotMode}
                        envelope={envelope}
                      />
                    )}
                  </WithAnalysis>
                </div>
              )}
            </div>
            <SplitHandle
              orientation="horizontal"
              label="Resize the chain canvas"
              value={chainHeight}
              min={CANVAS_HEIGHT + 8}
              max={Math.max(CANVAS_HEIGHT + 8, mainSize.height - 200)}
              onChange={setChainHeight}
              inverted
            />
            <section aria-label="Chain canvas" className="flex shrink-0 flex-col gap-1">
              {editable && <ElementPalette onAdd={addElement} />}
              <div
                ref={chainBox}
                className="rounded-md border border-rule bg-card"
                style={{ height: chainHeight }}
              >
                {design && (
                  <ChainCanvas
                    design={design}
                    width={Math.max(0, chainSize.width - 2)}
                    selectedId={selectedId}
                    onSelect={selectByUser}
                    editable={editable}
                    series={series}
                    onTune={edits.tuneField}
                    onMove={edits.move}
                    onRemove={removeEl}
                    onDuplicate={duplicateEl}
                    peers={presence.peers}
                    onCursor={presence.setCursor}
                  />
                )}
              </div>
            </section>
          </div>
        </div>

        <SplitHandle
          orientation="vertical"
          label="Resize the side panel"
          value={sideWidth}
          min={300}
          max={640}
          onChange={setSideWidth}
          inverted
        />

        {/* side panel */}
        <aside
          aria-label="Side panel"
          className="flex shrink-0 flex-col border-l border-rule bg-paper/40"
          style={{ width: sideWidth }}
        >
          <SideTabs<TabKey> tabs={tabs} active={tab} onChange={setTab} label="Side panel" panels={panels} />
          {lostAccess && (
            <p className="border-t border-rule p-2 text-xs">
              <Link to={paths.rooms.getHref()} className="font-semibold underline">
                Back to your rooms
              </Link>
            </p>
          )}
        </aside>
      </div>
    </div>
  );
}

/** The newest analysis for the views that draw it: a result re-renders these, not the workspace. */
function WithAnalysis({
  store,
  children,
}: {
  store: AnalysisStore;
  children: (a: AnalysisState) => ReactNode;
}) {
  return <>{children(useAnalysisState(store))}</>;
}

/** Renders its children while active; while inactive (and staying so) it skips re-rendering. */
const HiddenWhileInactive = memo(
  function HiddenWhileInactive({ children }: { active: boolean; children: ReactNode }) {
    return <>{children}</>;
  },
  (prev, next) => !prev.active && !next.active,
);

function ConnectionChip({ status, synced }: { status: string; synced: boolean }) {
  const text =
    status === 'denied'
      ? 'No access'
      : status === 'connected'
        ? synced
          ? 'Live'
          : 'Syncing…'
        : status === 'connecting'
          ? 'Connecting…'
          : 'Reconnecting…';
  const tone =
    status === 'connected' && synced
      ? 'bg-teal-soft text-teal-deep'
      : status === 'denied'
        ? 'bg-coral-soft text-coral-deep'
        : 'bg-amber-soft text-amber-deep';
  return (
    <span
      role="status"
      className={`flex items-center gap-1.5 rounded-full px-2 py-0.5 text-[11px] font-bold ${tone}`}
      data-testid="connection-status"
    >
      <span className="size-1.5 rounded-full bg-current" aria-hidden="true" />
      {text}
    </span>
  );
}

/** The chain as a list (port side first, as on the canvas): a keyboard and screen-reader way to pick an element. */
function ChainList({
  design,
  selectedId,
  onSelect,
}: {
  design: NonNullable<ReturnType<typeof useRoomDesign>['design']>;
  selectedId: string | null;
  onSelect(id: string): void;
}) {
  if (!design.elements.length) return null;
  const fromPort = [...design.elements].reverse();
  return (
    <section aria-labelledby="chain-list-title">
      <h3 id="chain-list-title" className="mb-1 text-xs font-bold text-ink-soft">
        Chain, port → load
      </h3>
      <ol className="flex flex-col gap-0.5" data-testid="chain-list">
        {fromPort.map((e) => (
          <li key={e.id}>
            <button
              type="button"
              aria-current={e.id === selectedId ? 'true' : undefined}
              onClick={() => onSelect(e.id)}
              className={
                e.id === selectedId
                  ? 'numeric w-full rounded-md bg-amber-soft px-2 py-1 text-left text-xs font-semibold text-ink ring-1 ring-amber'
                  : 'numeric w-full rounded-md px-2 py-1 text-left text-xs text-ink hover:bg-paper-deep'
              }
            >
              {elementDescription(e)}
            </button>
          </li>
        ))}
      </ol>
    </section>
  );
}
