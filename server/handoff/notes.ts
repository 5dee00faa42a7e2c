/**
 * The room's review notes for the report, read-only: each note followed by its replies, oldest first,
 * with the author's display name (null when the account is gone).
 */
import type { Knex } from 'knex';
import type { ReportNote } from '../../shared/handoff/report-model';

interface NoteRow {
  id: string;
  parent_id: string | null;
  element_id: string | null;
  frequency_hz: number | null;
  body: string;
  resolved: number | boolean;
  created_at: number | string;
  display_name: string | null;
}

export async function loadReportNotes(knex: Knex, roomId: string): Promise<ReportNote[]> {
  const rows = (await knex('notes as n')
    .leftJoin('users as u', 'u.id', 'n.author_id')
    .where('n.room_id', roomId)
    .orderBy([
      { column: 'n.created_at', order: 'asc' },
      { column: 'n.id', order: 'asc' },
    ])
    .select('n.id', 'n.parent_id', 'n.element_id', 'n.frequency_hz', 'n.body', 'n.resolved', 'n.created_at', 'u.display_name')) as NoteRow[];
  const ids = new Set(rows.map((r) => r.id));
  const replies = new Map<string, NoteRow[]>();
  for (const r of rows)
    if (r.parent_id && ids.has(r.parent_id) && r.parent_id !== r.id) replies.set(r.parent_id, [...(replies.get(r.parent_id) ?? []), r]);
  const view = (r: NoteRow, reply: boolean): ReportNote => ({
    author: r.display_name,
    createdAt: Number(r.created_at),
    body: r.body,
    elementId: r.element_id,
    frequencyHz: r.frequency_hz === null ? null : Number(r.frequency_hz),
    resolved: Boolean(r.resolved),
    reply,
  });
  const out: ReportNote[] = [];
  for (const r of rows) {
    if (r.parent_id && ids.has(r.parent_id) && r.parent_id !== r.id) continue; // listed under its parent
    out.push(view(r, false));
    // One level of threading; deeper replies follow in time order under the top note.
    const stack = [...(replies.get(r.id) ?? [])];
    const seen = new Set<string>([r.id]);
    while (stack.length) {
      const c = stack.shift() as NoteRow;
      if (seen.has(c.id)) continue;
      seen.add(c.id);
      out.push(view(c, true));
      stack.push(...(replies.get(c.id) ?? []));
    }
  }
  return out;
}
