/**
 * The hand-off pack of a room: loads the room's design (as stored), its name and notes, runs the
 * engine once, and builds any of the pack's files, or all of them as one zip (fflate, off the main
 * thread). A design the engine refuses (a measured load that does not cover the sweep, ...) gives a
 * 409 naming the reason, for the files that need the analysis; the design file and the line
 * dimensions export anyway.
 */
import { zip, type AsyncZippable } from 'fflate';
import type { Knex } from 'knex';
import { bomCsv, bomRows, bomSeriesFor, type BomRow, type BomSeries } from '../../shared/handoff/bom';
import { HANDOFF_FILES, needsAnalysis, type HandoffFile } from '../../shared/handoff/files';
import { lineTable, linesCsv, type LineTable } from '../../shared/handoff/lines';
import { reportModel, type ReportNote } from '../../shared/handoff/report-model';
import { smithPicture } from '../../shared/handoff/smith-picture';
import { sweepPicture } from '../../shared/handoff/sweep-picture';
import { matchedInputTouchstone, networkTouchstone } from '../../shared/handoff/touchstone-export';
import { analyze, type AnalysisResult } from '../../shared/rf/analyze';
import { DesignError, type Design } from '../../shared/rf/design';
import { impedancePath, type ImpedancePath } from '../../shared/rf/impedance-path';
import { loadRoomDesign } from '../collab/store';
import { HttpError } from '../errors';
import { roomNotFound } from '../rooms/access';
import { loadReportNotes } from './notes';
import { renderReportPdf, SMITH_BOX, SWEEP_BOX } from './pdf/report-pdf';

export interface HandoffOptions {
  series?: BomSeries;
  /** export time, Unix ms (default now) */
  now?: number;
}

export interface HandoffContext {
  roomId: string;
  roomName: string;
  design: Design;
  exportedAt: number;
  series?: BomSeries;
  /** the analysis (run on first need), or why the engine refused the design */
  analysis?: { ok: true; result: AnalysisResult } | { ok: false; message: string };
}

export interface HandoffBody {
  body: Buffer;
  contentType: string;
}

const CONTENT_TYPES: Record<HandoffFile, string> = {
  'bom.csv': 'text/csv; charset=utf-8; header=present',
  'lines.csv': 'text/csv; charset=utf-8; header=present',
  'network.s2p': 'text/plain; charset=us-ascii',
  'matched-input.s1p': 'text/plain; charset=us-ascii',
  'design.matchloom.json': 'application/json; charset=utf-8',
  'report.pdf': 'application/pdf',
};

/**
 * The engine's refusals: its typed errors with a code and a readable message (DesignError names the
 * JSON path), and RangeError, which it uses for arguments it cannot take.
 */
function isEngineRefusal(e: unknown): e is Error {
  return e instanceof DesignError || e instanceof RangeError || (e instanceof Error && typeof (e as { code?: unknown }).code === 'string');
}

function analysisOf(design: Design): NonNullable<HandoffContext['analysis']> {
  try {
    return { ok: true, result: analyze(design) };
  } catch (e) {
    // Anything else is a fault of ours: let it be a logged 500 rather than dress it up as the design's.
    if (!isEngineRefusal(e)) throw e;
    return { ok: false, message: e.message || 'the engine could not analyse the design' };
  }
}

/** Loads what the pack is built from; 404 when the room is gone, 409 when its document is not a design. */
export async function loadHandoffContext(knex: Knex, roomId: string, opts: HandoffOptions = {}): Promise<HandoffContext> {
  const room = (await knex('rooms').where({ id: roomId }).first('name')) as { name: string } | undefined;
  if (!room) throw roomNotFound();
  let design: Design;
  try {
    design = await loadRoomDesign(knex, roomId);
  } catch (e) {
    if (e instanceof DesignError)
      throw new HttpError(409, 'invalid-design', `The room document does not hold a valid design: ${e.message}`, { path: e.path });
    throw e;
  }
  return { roomId, roomName: room.name, design, exportedAt: opts.now ?? Date.now(), series: opts.series };
}

function resultOf(ctx: HandoffContext): AnalysisResult {
  ctx.analysis ??= analysisOf(ctx.design);
  if (ctx.analysis.ok) return ctx.analysis.result;
  throw new HttpError(409, 'analysis-failed', `The design cannot be analysed, so this export is not available: ${ctx.analysis.message}`);
}

function pathOf(design: Design): ImpedancePath | null {
  try {
    return impedancePath(design);
  } catch {
    return null;
  }
}

export function handoffBom(ctx: HandoffContext): BomRow[] {
  return bomRows(ctx.design, resultOf(ctx).stressAtCenter, bomSeriesFor(ctx.series));
}

export function handoffLines(ctx: HandoffContext): LineTable {
  return lineTable(ctx.design);
}

export async function handoffReport(ctx: HandoffContext, notes: ReportNote[]): Promise<Buffer> {
  const result = resultOf(ctx);
  const lines = handoffLines(ctx);
  const model = reportModel({ roomName: ctx.roomName, design: ctx.design, result, bom: handoffBom(ctx), lines, notes, generatedAt: ctx.exportedAt });
  const pictures = { smith: smithPicture(SMITH_BOX, ctx.design, result, pathOf(ctx.design)), sweep: sweepPicture(SWEEP_BOX, ctx.design, result) };
  return renderReportPdf({ model, pictures, lines, createdAt: ctx.exportedAt });
}

/** One file of the pack. */
export async function handoffFile(knex: Knex, ctx: HandoffContext, file: HandoffFile): Promise<HandoffBody> {
  if (needsAnalysis(file)) resultOf(ctx);
  const header = { roomName: ctx.roomName, exportedAt: new Date(ctx.exportedAt).toISOString() };
  let body: Buffer;
  switch (file) {
    case 'bom.csv':
      body = Buffer.from(bomCsv(handoffBom(ctx)), 'utf8');
      break;
    case 'lines.csv':
      body = Buffer.from(linesCsv(handoffLines(ctx)), 'utf8');
      break;
    case 'network.s2p':
      body = Buffer.from(networkTouchstone(ctx.design, resultOf(ctx), header), 'ascii');
      break;
    case 'matched-input.s1p':
      body = Buffer.from(matchedInputTouchstone(ctx.design, resultOf(ctx), header), 'ascii');
      break;
    case 'design.matchloom.json':
      body = Buffer.from(`${JSON.stringify(ctx.design, null, 2)}\n`, 'utf8');
      break;
    case 'report.pdf':
      body = await handoffReport(ctx, await loadReportNotes(knex, ctx.roomId));
      break;
  }
  return { body, contentType: CONTENT_TYPES[file] };
}

/** Every file of the pack in one zip (the PDF stored, the text deflated). */
export async function handoffZip(knex: Knex, ctx: HandoffContext): Promise<Buffer> {
  resultOf(ctx);
  const mtime = new Date(ctx.exportedAt);
  const files: AsyncZippable = {};
  for (const file of HANDOFF_FILES) {
    const { body } = await handoffFile(knex, ctx, file);
    files[file] = [new Uint8Array(body.buffer, body.byteOffset, body.byteLength), { level: file === 'report.pdf' ? 0 : 6, mtime }];
  }
  const bytes = await new Promise<Uint8Array>((resolve, reject) => zip(files, { level: 6 }, (err, data) => (err ? reject(err) : resolve(data))));
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}
