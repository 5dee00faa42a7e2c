/**
 * Room log wording: what changed between two states of a room's design, in words an engineer reads
 * ("changed C2 from 1.2 pF to 1.5 pF", "added shunt C C3 (1.5 pF)", "moved L1 to position 2 of 3").
 * The server diffs the design before and after each accepted update, merges rapid edits of one field
 * (`mergeChanges`: the first "from" with the last "to") and prefixes the person's name.
 *
 * Pure: the input is plain data (`designSnapshot` reads it from a document), nothing here throws on
 * odd values a peer may have written.
 */
import type * as Y from 'yjs';
import { formatEngineering, type Unit } from '../rf/units';
import { elementOrderKeys, readDesignInput } from './schema';

type Obj = Record<string, unknown>;

/** The design as plain data: top-level fields, the chain (load -> port) and each element's order key. */
export interface DesignSnapshot {
  fields: Obj;
  elements: Obj[];
  orders: Record<string, string>;
}

export type DesignChange =
  | { type: 'design-field'; key: string; field: string; from: unknown; to: unknown }
  | {
      type: 'element-field';
      key: string;
      elementId: string;
      field: string;
      /** The element's designator after the change ("C2"), and before it (differs for a relabel). */
      subject: string;
      subjectBefore: string;
      elementKind: string;
      from: unknown;
      to: unknown;
    }
  | { type: 'element-added'; key: string; elementId: string; subject: string; element: Obj }
  | { type: 'element-removed'; key: string; elementId: string; subject: string; element: Obj }
  | { type: 'element-moved'; key: string; elementId: string; subject: string; from: number; to: number; count: number }
  | { type: 'chain-replaced'; key: string; elements: { subject: string; element: Obj }[] }
  | { type: 'summary'; key: string; count: number };

/** More individual changes than this in one update are reported as one summary entry. */
export const MAX_CHANGES_PER_UPDATE = 6;

const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const num = (v: unknown): number => (typeof v === 'number' ? v : NaN);
const str = (v: unknown): string => (typeof v === 'string' ? v : '');

/** The design of a document as plain data, or null if the document is not shaped like a design. */
export function designSnapshot(doc: Y.Doc): DesignSnapshot | null {
  try {
    const input = readDesignInput(doc) as unknown as Obj;
    const fields: Obj = {};
    for (const [k, v] of Object.entries(input)) if (k !== 'elements' && k !== 'format' && k !== 'version') fields[k] = v;
    const elements = Array.isArray(input.elements) ? (input.elements as unknown[]).filter(isObj) : [];
    return { fields, elements, orders: elementOrderKeys(doc) };
  } catch {
    return null;
  }
}

/** Structural equality of JSON values. */
export function jsonEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== typeof b || a === null || b === null || typeof a !== 'object') return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const bb = b as unknown[];
    return a.length === bb.length && a.every((x, i) => jsonEqual(x, bb[i]));
  }
  const ak = Object.keys(a as Obj).filter((k) => (a as Obj)[k] !== undefined);
  const bk = Object.keys(b as Obj).filter((k) => (b as Obj)[k] !== undefined);
  return ak.length === bk.length && ak.every((k) => jsonEqual((a as Obj)[k], (b as Obj)[k]));
}

// ---- element names ----

const KIND_WORDS: Record<string, string> = {
  'series-l': 'series L',
  'series-c': 'series C',
  'series-r': 'series R',
  'shunt-l': 'shunt L',
  'shunt-c': 'shunt C',
  'shunt-r': 'shunt R',
  line: 'line',
  'open-stub': 'open stub',
  'short-stub': 'shorted stub',
  transformer: 'transformer',
  'two-port': 'two-port',
};

/** "shunt C", "open stub", ... (the kind as an engineer says it). */
export function elementKindWord(kind: unknown): string {
  return KIND_WORDS[str(kind)] ?? (str(kind) || 'element');
}

/** Reference-designator letters: L, C, R, TL (lines and stubs), T (transformer), N (two-port network). */
export function designatorLetter(kind: unknown): string {
  const k = str(kind);
  if (k.endsWith('-l')) return 'L';
  if (k.endsWith('-c')) return 'C';
  if (k.endsWith('-r')) return 'R';
  if (k === 'line' || k === 'open-stub' || k === 'short-stub') return 'TL';
  if (k === 'transformer') return 'T';
  if (k === 'two-port') return 'N';
  return 'E';
}

/**
 * Each element's designator: its label if it has one, else its letter and its count among the elements
 * with that letter, from the load end (the first capacitor from the load is C1).
 */
export function elementDesignators(elements: readonly Obj[]): Map<string, string> {
  const counts = new Map<string, number>();
  const out = new Map<string, string>();
  for (const e of elements) {
    const letter = designatorLetter(e.kind);
    const n = (counts.get(letter) ?? 0) + 1;
    counts.set(letter, n);
    const label = str(e.label).trim();
    out.set(str(e.id), label || `${letter}${n}`);
  }
  return out;
}

// ---- values ----

function valueUnit(kind: unknown): Unit {
  const letter = designatorLetter(kind);
  return letter === 'L' ? 'H' : letter === 'C' ? 'F' : letter === 'R' ? 'Ω' : '';
}

const plain = (v: unknown) => formatEngineering(num(v), '');
const withUnit = (v: unknown, unit: Unit) => formatEngineering(num(v), unit);

function complexOhms(v: unknown): string {
  if (!Array.isArray(v) || v.length !== 2) return '—';
  const [re, im] = v.map(num);
  if (im === 0) return withUnit(re, 'Ω');
  return `${plain(re)}${im < 0 ? '−' : '+'}j${plain(Math.abs(im))} Ω`;
}

/** "433.1–434.8 MHz" (4 digits), or "900 MHz–1.1 GHz" when the prefixes differ. */
export function frequencyRange(startHz: unknown, stopHz: unknown): string {
  // Four digits: band edges such as 433.05 MHz or 2.4835 GHz must not round into each other.
  const a = formatEngineering(num(startHz), 'Hz', { digits: 4 });
  const b = formatEngineering(num(stopHz), 'Hz', { digits: 4 });
  const [na, ua] = a.split(' ');
  const [nb, ub] = b.split(' ');
  return ua !== undefined && ua === ub ? `${na}–${nb} ${ua}` : `${a}–${b}`;
}

function loadText(v: unknown): string {
  if (!isObj(v)) return '—';
  switch (v.kind) {
    case 'impedance':
      return complexOhms(v.ohms);
    case 'rlc': {
      const parts = [`R ${withUnit(v.r, 'Ω')}`];
      if (v.l !== undefined) parts.push(`L ${withUnit(v.l, 'H')}`);
      if (v.c !== undefined) parts.push(`C ${withUnit(v.c, 'F')}`);
      return `${str(v.topology) || 'series'} RLC (${parts.join(', ')})`;
    }
    case 'measured':
      return str(v.fileName) ? `measured data from ${str(v.fileName)}` : 'measured data';
    case 'table':
      return `a table of ${Array.isArray(v.points) ? v.points.length : 0} points`;
    default:
      return 'an unknown load';
  }
}

function bandText(v: unknown): string {
  if (!isObj(v)) return '—';
  const range = frequencyRange(v.startHz, v.stopHz);
  return v.centerHz !== undefined ? `${range} (centre ${withUnit(v.centerHz, 'Hz')})` : range;
}

function sweepText(v: unknown): string {
  if (!isObj(v)) return '—';
  return `${frequencyRange(v.startHz, v.stopHz)}, ${num(v.points)} points${v.spacing === 'log' ? ', log' : ''}`;
}

function goalText(v: unknown): string {
  if (!isObj(v)) return '—';
  if (v.maxVswr !== undefined) return `VSWR ≤ ${plain(v.maxVswr)}`;
  if (v.minReturnLossDb !== undefined) return `return loss ≥ ${plain(v.minReturnLossDb)} dB`;
  return '—';
}

function substrateText(v: unknown): string {
  if (!isObj(v)) return '—';
  const parts = [`εr ${plain(v.epsilonR)}`, `${withUnit(v.heightM, 'm')} thick`];
  if (v.copperM !== undefined) parts.push(`${withUnit(v.copperM, 'm')} copper`);
  return parts.join(', ');
}

function lengthText(v: unknown): string {
  if (!isObj(v)) return '—';
  if (v.degrees !== undefined) return `${plain(v.degrees)}° at ${withUnit(v.atHz, 'Hz')}`;
  if (v.meters !== undefined) return `${withUnit(v.meters, 'm')} (velocity factor ${plain(v.velocityFactor)})`;
  return '—';
}

function toleranceText(v: unknown, unit: Unit): string {
  if (!isObj(v)) return '—';
  const amount = v.relative !== undefined ? `±${plain(num(v.relative) * 100)} %` : `±${withUnit(v.absolute, unit)}`;
  return v.distribution ? `${amount} ${str(v.distribution)}` : amount;
}

function genericText(v: unknown): string {
  const s = JSON.stringify(v) ?? '—';
  return s.length > 60 ? `${s.slice(0, 57)}...` : s;
}

const DESIGN_FIELD_TEXT: Record<string, { label: string; text: (v: unknown) => string }> = {
  name: { label: 'design name', text: (v) => `“${str(v)}”` },
  referenceOhms: { label: 'reference impedance', text: (v) => withUnit(v, 'Ω') },
  port: { label: 'port impedance', text: (v) => (isObj(v) ? complexOhms(v.impedance) : '—') },
  load: { label: 'load', text: loadText },
  band: { label: 'band', text: bandText },
  sweep: { label: 'sweep', text: sweepText },
  goal: { label: 'goal', text: goalText },
  drive: { label: 'drive power', text: (v) => (isObj(v) ? withUnit(v.powerW, 'W') : '—') },
  substrate: { label: 'substrate', text: substrateText },
};

/** How an element field reads: `label` null means the sentence names the element itself ("changed C2 ..."). */
function elementFieldText(field: string, kind: string): { label: string | null; text: (v: unknown) => string } {
  const unit = valueUnit(kind);
  switch (field) {
    case 'value':
      return { label: null, text: (v) => withUnit(v, unit) };
    case 'q':
      return { label: 'Q', text: plain };
    case 'z0':
      return { label: 'Z0', text: (v) => withUnit(v, 'Ω') };
    case 'length':
      return { label: 'length', text: lengthText };
    case 'lossDbPerM':
      return { label: 'loss', text: (v) => `${plain(v)} dB/m` };
    case 'ratio':
      return { label: 'turns ratio', text: plain };
    case 'tolerance':
      return { label: 'tolerance', text: (v) => toleranceText(v, unit) };
    default:
      return { label: field, text: genericText };
  }
}

/** The element's main value for "added ... (4.7 nH)", or ''. */
function elementSummary(e: Obj): string {
  if (e.value !== undefined) return withUnit(e.value, valueUnit(e.kind));
  if (e.z0 !== undefined) return `${withUnit(e.z0, 'Ω')}, ${lengthText(e.length)}`;
  if (e.ratio !== undefined) return `ratio ${plain(e.ratio)}`;
  return '';
}

function elementPhrase(subject: string, e: Obj): string {
  const summary = elementSummary(e);
  return `${elementKindWord(e.kind)} ${subject}${summary ? ` (${summary})` : ''}`;
}

// ---- the diff ----

/** Fields an element may carry that are not worth a log line of their own. */
const QUIET_ELEMENT_FIELDS = new Set(['id', 'uploadId']);

function designFieldChanges(before: DesignSnapshot, after: DesignSnapshot): DesignChange[] {
  const out: DesignChange[] = [];
  const keys = new Set([...Object.keys(before.fields), ...Object.keys(after.fields)]);
  for (const field of keys) {
    const from = before.fields[field];
    const to = after.fields[field];
    if (!jsonEqual(from, to)) out.push({ type: 'design-field', key: `design:${field}`, field, from, to });
  }
  return out;
}

/** The changes from `before` to `after`, in reading order (design fields, removals, additions, moves, edits). */
export function describeDesignChanges(before: DesignSnapshot, after: DesignSnapshot): DesignChange[] {
  const out = designFieldChanges(before, after);
  const beforeById = new Map(before.elements.map((e) => [str(e.id), e]));
  const afterById = new Map(after.elements.map((e) => [str(e.id), e]));
  const namesBefore = elementDesignators(before.elements);
  const namesAfter = elementDesignators(after.elements);
  const removed = before.elements.filter((e) => !afterById.has(str(e.id)));
  const added = after.elements.filter((e) => !beforeById.has(str(e.id)));

  if (removed.length + added.length >= 3) {
    out.push({
      type: 'chain-replaced',
      key: 'chain',
      elements: after.elements.map((e) => ({ subject: namesAfter.get(str(e.id)) ?? '?', element: e })),
    });
    return cap(out);
  }
  for (const e of removed) {
    const id = str(e.id);
    out.push({ type: 'element-removed', key: `remove:${id}`, elementId: id, subject: namesBefore.get(id) ?? id, element: e });
  }
  for (const e of added) {
    const id = str(e.id);
    out.push({ type: 'element-added', key: `add:${id}`, elementId: id, subject: namesAfter.get(id) ?? id, element: e });
  }

  // A reorder changes one element's order key; report it only if the chain order really changed.
  const commonBefore = before.elements.map((e) => str(e.id)).filter((id) => afterById.has(id));
  const commonAfter = after.elements.map((e) => str(e.id)).filter((id) => beforeById.has(id));
  if (!jsonEqual(commonBefore, commonAfter)) {
    for (const id of commonAfter) {
      if (before.orders[id] === after.orders[id]) continue;
      out.push({
        type: 'element-moved',
        key: `move:${id}`,
        elementId: id,
        subject: namesAfter.get(id) ?? id,
        from: before.elements.findIndex((e) => str(e.id) === id) + 1,
        to: after.elements.findIndex((e) => str(e.id) === id) + 1,
        count: after.elements.length,
      });
    }
  }

  for (const e of after.elements) {
    const id = str(e.id);
    const old = beforeById.get(id);
    if (!old) continue;
    const fields = new Set([...Object.keys(old), ...Object.keys(e)]);
    // A relabel is one change even though the designator (the sentence's subject) changes with it.
    for (const field of fields) {
      if (QUIET_ELEMENT_FIELDS.has(field)) continue;
      if (jsonEqual(old[field], e[field])) continue;
      out.push({
        type: 'element-field',
        key: `el:${id}:${field}`,
        elementId: id,
        field,
        subject: namesAfter.get(id) ?? id,
        subjectBefore: namesBefore.get(id) ?? id,
        elementKind: str(e.kind),
        from: old[field],
        to: e[field],
      });
    }
  }
  return cap(out);
}

function cap(changes: DesignChange[]): DesignChange[] {
  return changes.length > MAX_CHANGES_PER_UPDATE ? [{ type: 'summary', key: 'summary', count: changes.length }] : changes;
}

/**
 * Merge a later change into an earlier one with the same key: the result reads from the earlier
 * "from" to the later "to". Returns null when the keys differ or the change has no from/to.
 */
export function mergeChanges(earlier: DesignChange, later: DesignChange): DesignChange | null {
  if (earlier.key !== later.key) return null;
  if (earlier.type === 'design-field' && later.type === 'design-field') return { ...later, from: earlier.from };
  if (earlier.type === 'element-field' && later.type === 'element-field')
    return { ...later, from: earlier.from, subjectBefore: earlier.subjectBefore };
  if (earlier.type === 'element-moved' && later.type === 'element-moved') return { ...later, from: earlier.from };
  return null;
}

// ---- sentences ----

function fieldSentence(label: string, subjectSuffix: string, fmt: (v: unknown) => string, from: unknown, to: unknown): string {
  const what = `the ${label}${subjectSuffix}`;
  if (from === undefined) return `set ${what} to ${fmt(to)}`;
  if (to === undefined) return `removed ${what} (was ${fmt(from)})`;
  if (jsonEqual(from, to)) return `set ${what} back to ${fmt(to)}`;
  return `changed ${what} from ${fmt(from)} to ${fmt(to)}`;
}

function elementFieldSentence(c: Extract<DesignChange, { type: 'element-field' }>): string {
  const { field, subject, subjectBefore, from, to } = c;
  if (field === 'locked') return to === true ? `locked ${subject}` : `unlocked ${subject}`;
  if (field === 'flipped') return to === true ? `flipped ${subject}` : `unflipped ${subject}`;
  if (field === 'touchstone') return `replaced the S-parameters of ${subject}`;
  if (field === 'label') return subject === subjectBefore ? `relabelled ${subject}` : `renamed ${subjectBefore} to ${subject}`;
  if (field === 'kind') return `changed ${subjectBefore} from ${elementKindWord(from)} to ${elementKindWord(to)}`;
  const { label, text } = elementFieldText(field, c.elementKind);
  if (label !== null) return fieldSentence(label, ` of ${subject}`, text, from, to);
  if (from === undefined) return `set ${subject} to ${text(to)}`;
  if (jsonEqual(from, to)) return `set ${subject} back to ${text(to)}`;
  return `changed ${subject} from ${text(from)} to ${text(to)}`;
}

/** The change as the end of a sentence whose subject is the person: "changed C2 from 1.2 pF to 1.5 pF". */
export function changeSentence(c: DesignChange): string {
  switch (c.type) {
    case 'design-field': {
      const d = DESIGN_FIELD_TEXT[c.field] ?? { label: c.field, text: genericText };
      if (c.field === 'name' && c.from !== undefined && c.to !== undefined && !jsonEqual(c.from, c.to))
        return `renamed the design from ${d.text(c.from)} to ${d.text(c.to)}`;
      return fieldSentence(d.label, '', d.text, c.from, c.to);
    }
    case 'element-field':
      return elementFieldSentence(c);
    case 'element-added':
      return `added ${elementPhrase(c.subject, c.element)}`;
    case 'element-removed':
      return `removed ${elementPhrase(c.subject, c.element)}`;
    case 'element-moved':
      return c.from === c.to ? `moved ${c.subject} and back` : `moved ${c.subject} to position ${c.to} of ${c.count} (from the load)`;
    case 'chain-replaced':
      return c.elements.length === 0
        ? 'cleared the chain'
        : `replaced the chain: ${c.elements.map((e) => elementPhrase(e.subject, e.element)).join(', ')}`;
    case 'summary':
      return `made ${c.count} changes to the design`;
  }
}
