/**
 * `npm run --silent match -- <design.matchloom.json | -> [--keep N] [--q 2,5,10] [--line-z0 Ω]
 *  [--stub-z0 Ω] [--binomial 2,3] [--chebyshev 3] [--ripple 0.05] [--snap E12,E24]`
 * prints `{ "candidates": [ { "topology", "elements", ... } ], ... }` (CONTRACT §3).
 */
import { findMatches, type MatchResult } from '../../shared/rf/match';
import { readDesignArg, runCli } from './io';
import { flagsParsed, listOf, oneOf, positiveNumber, wholeNumber } from './match-flags';

const SERIES = ['E6', 'E12', 'E24', 'E48', 'E96', 'E192'] as const;

/** The finder's result as JSON: the contract's `candidates` first, `explanation` only when there is none. */
export function matchResultJson(r: MatchResult): Record<string, unknown> {
  return {
    candidates: r.candidates,
    ...(r.explanation ? { explanation: r.explanation } : {}),
    centerHz: r.centerHz,
    loadOhms: r.loadOhms,
    targetOhms: r.targetOhms,
    notes: r.notes,
  };
}

runCli(async (argv) => {
  const { rest, flags } = flagsParsed<{
    keep: number;
    q: number[];
    'line-z0': number;
    'stub-z0': number;
    binomial: number[];
    chebyshev: number[];
    ripple: number;
    snap: (typeof SERIES)[number][];
  }>(argv, {
    keep: wholeNumber(0, 1000),
    q: listOf(positiveNumber),
    'line-z0': positiveNumber,
    'stub-z0': positiveNumber,
    binomial: listOf(wholeNumber(1, 12)),
    chebyshev: listOf(wholeNumber(1, 12)),
    ripple: positiveNumber,
    snap: listOf(oneOf(SERIES)),
  });
  const design = await readDesignArg(rest);
  const result = findMatches(design, {
    keep: flags.keep,
    qs: flags.q,
    lineZ0: flags['line-z0'],
    stubZ0: flags['stub-z0'],
    binomialSections: flags.binomial,
    chebyshevSections: flags.chebyshev,
    chebyshevRipple: flags.ripple,
    snapSeries: flags.snap,
  });
  return matchResultJson(result);
});
