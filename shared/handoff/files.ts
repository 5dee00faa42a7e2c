/**
 * The files of the hand-off pack, their names inside the zip, and the download names (from a slug of
 * the room name) of the single exports.
 */

export const HANDOFF_FILES = ['bom.csv', 'lines.csv', 'network.s2p', 'matched-input.s1p', 'design.matchloom.json', 'report.pdf'] as const;
export type HandoffFile = (typeof HANDOFF_FILES)[number];

export function isHandoffFile(name: string): name is HandoffFile {
  return (HANDOFF_FILES as readonly string[]).includes(name);
}

/** "2-4-ghz-module-antenna-bom.csv", "2-4-ghz-module-antenna.matchloom.json", ... */
export function handoffDownloadName(slug: string, file: HandoffFile | 'handoff.zip'): string {
  return file === 'design.matchloom.json' ? `${slug}.matchloom.json` : `${slug}-${file}`;
}

/** Files whose content needs the analysis (a design the engine refuses cannot give them). */
export function needsAnalysis(file: HandoffFile): boolean {
  return file !== 'lines.csv' && file !== 'design.matchloom.json';
}
