/** Plain text cut into runs of words and web addresses, so the addresses can be drawn as links. Pure. */
export type TextRun = { kind: 'text'; text: string } | { kind: 'link'; href: string; text: string };

const URL_AT = /https?:\/\/[^\s<>"')\]]+/g;

export function linkedText(text: string): TextRun[] {
  const runs: TextRun[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_AT)) {
    // A sentence's full stop or comma right after an address is not part of it.
    const href = match[0].replace(/[.,;:!?]+$/, '');
    const at = match.index ?? 0;
    if (at > last) runs.push({ kind: 'text', text: text.slice(last, at) });
    runs.push({ kind: 'link', href, text: href });
    last = at + href.length;
  }
  if (last < text.length) runs.push({ kind: 'text', text: text.slice(last) });
  return runs;
}
