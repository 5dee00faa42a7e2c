/**
 * A fingerprint of the whole database (every table's row count and a SHA-256 of its rows in rowid
 * order), to show that a refused request wrote nothing.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';

export type Fingerprint = Record<string, { rows: number; sha256: string }>;

function canonical(value: unknown): unknown {
  if (value instanceof Uint8Array) return { bytes: Buffer.from(value).toString('base64') };
  return value;
}

export async function fingerprint(knex: Knex): Promise<Fingerprint> {
  const tables = (await knex.raw(
    "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'knex_%' ORDER BY name",
  )) as { name: string }[];
  const out: Fingerprint = {};
  for (const { name } of tables) {
    const rows = (await knex.raw(`SELECT * FROM "${name.replace(/"/g, '""')}" ORDER BY rowid`)) as Record<string, unknown>[];
    const hash = createHash('sha256');
    for (const row of rows) hash.update(JSON.stringify(Object.entries(row).map(([k, v]) => [k, canonical(v)])) + '\n');
    out[name] = { rows: rows.length, sha256: hash.digest('hex') };
  }
  return out;
}

/** The tables whose content differs between two fingerprints. */
export function changedTables(before: Fingerprint, after: Fingerprint): string[] {
  const names = new Set([...Object.keys(before), ...Object.keys(after)]);
  return [...names].filter((n) => before[n]?.sha256 !== after[n]?.sha256).sort();
}

/**
 * Rows inserted, updated or deleted so far through the server's database connection (SQLite's
 * `total_changes()`; Knex keeps one connection for SQLite, so every write the server makes counts).
 * Cheap enough to read around every request.
 */
export async function writeCount(knex: Knex): Promise<number> {
  const rows = (await knex.raw('SELECT total_changes() AS n')) as { n: number }[];
  return Number(rows[0].n);
}
