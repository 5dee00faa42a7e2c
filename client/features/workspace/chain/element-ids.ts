/**
 * New elements get a user-facing label like L1, C2, TL1 (the kind's prefix, shared/rf/match-ids,
 * and the next number not yet used with that prefix among the room's ids and labels) and an id
 * that is that label plus a short random suffix ("L1-k3f9"). Two tuners adding the same kind of
 * part at the same instant both pick label L1, but their ids differ, so neither insert overwrites
 * the other in the shared document (insertElement refuses an existing id locally; only concurrent
 * remote inserts could collide, and the suffix makes that vanishingly unlikely).
 */
import type { ElementKind } from '../../../../shared/rf/design';
import { elementIdPrefix } from '../../../../shared/rf/match-ids';

export interface NewElementName {
  id: string;
  label: string;
}

const SUFFIX_ALPHABET = 'abcdefghijkmnpqrstuvwxyz23456789';

/** Four characters from an unambiguous alphabet (32^4 ≈ 1 M choices), from the platform's CSPRNG when present. */
export function randomSuffix(random: () => number = defaultRandom): string {
  let s = '';
  for (let i = 0; i < 4; i++) s += SUFFIX_ALPHABET[Math.floor(random() * SUFFIX_ALPHABET.length) % SUFFIX_ALPHABET.length];
  return s;
}

function defaultRandom(): number {
  const c = globalThis.crypto;
  if (c?.getRandomValues) return c.getRandomValues(new Uint32Array(1))[0]! / 2 ** 32;
  return Math.random();
}

/** The next free label for `kind` given the ids and labels already in the document ("L1-k3f9" counts as L1). */
export function nextElementLabel(kind: ElementKind, existingNames: Iterable<string>): string {
  const prefix = elementIdPrefix(kind);
  const taken = new Set<string>();
  const pattern = new RegExp(`^${prefix}(\\d+)(?:-[a-z0-9]+)?$`);
  let highest = 0;
  for (const name of existingNames) {
    const m = pattern.exec(name);
    if (!m) continue;
    highest = Math.max(highest, Number(m[1]));
    taken.add(`${prefix}${m[1]}`);
  }
  let n = highest + 1;
  while (taken.has(`${prefix}${n}`)) n++;
  return `${prefix}${n}`;
}

/** A label and a collision-free id for a new element of `kind`. */
export function allocateElementName(kind: ElementKind, existingNames: Iterable<string>, random?: () => number): NewElementName {
  const names = [...existingNames];
  const label = nextElementLabel(kind, names);
  const ids = new Set(names);
  let id = `${label}-${randomSuffix(random)}`;
  for (let tries = 0; ids.has(id) && tries < 16; tries++) id = `${label}-${randomSuffix(random)}`;
  return { id, label };
}
