/**
 * File names for the hand-off pack: a slug of the room name (lower-case ASCII letters, digits and
 * single hyphens; accents folded, everything else a separator), never empty, at most 60 characters.
 */

const ASCII_SPELLINGS: Record<string, string> = {
  '\u03a9': 'ohm', '\u2126': 'ohm', Γ: 'Gamma', ε: 'e', µ: 'u', μ: 'u', '≤': '<=', '≥': '>=', '±': '+/-', '°': ' deg', '×': 'x',
  '–': '-', '—': '-', '−': '-', '‘': "'", '’': "'", '“': '"', '”': '"', '…': '...', '·': '.',
  Ł: 'L', ł: 'l', Ø: 'O', ø: 'o', Đ: 'D', đ: 'd', ß: 'ss', Æ: 'AE', æ: 'ae', Œ: 'OE', œ: 'oe', Þ: 'Th', þ: 'th',
};

export function roomSlug(name: string): string {
  const folded = name
    .replace(/[^\x20-\x7e]/g, (c) => ASCII_SPELLINGS[c] ?? c)
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
  const cut = folded.slice(0, 60).replace(/-+$/g, '');
  return cut || 'room';
}


/** Text safe for a Touchstone comment (ASCII only): accents folded, a few symbols spelled, anything else "?". */
export function asciiText(text: string): string {
  return text
    .replace(/[^\x20-\x7e]/g, (c) => ASCII_SPELLINGS[c] ?? c)
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .replace(/[\r\n]+/g, ' ')
    .replace(/[^\x20-\x7e]/g, '?');
}
