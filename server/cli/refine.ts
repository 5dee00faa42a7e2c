/**
 * `npm run --silent refine -- <design.matchloom.json | -> [--snap E24] [--seed N] [--max-evaluations N]`
 * prints `{ "design", "worstInBand", "iterations", ... }` (CONTRACT §3).
 */
import { refineDesign } from '../../shared/rf/refine';
import { readDesignArg, runCli } from './io';
import { flagsParsed, oneOf, wholeNumber } from './match-flags';

const SERIES = ['E6', 'E12', 'E24', 'E48', 'E96', 'E192'] as const;

runCli(async (argv) => {
  const { rest, flags } = flagsParsed<{ snap: (typeof SERIES)[number]; seed: number; 'max-evaluations': number }>(argv, {
    snap: oneOf(SERIES),
    seed: wholeNumber(0, 2 ** 32 - 1),
    'max-evaluations': wholeNumber(1, 10_000_000),
  });
  const design = await readDesignArg(rest);
  const r = refineDesign(design, { snap: flags.snap, seed: flags.seed, maxEvaluations: flags['max-evaluations'] });
  return {
    design: r.design,
    worstInBand: r.worstInBand,
    iterations: r.iterations,
    evaluations: r.evaluations,
    improved: r.improved,
    initialWorstGamma: r.initialWorstGamma,
    ...(r.snappedIds ? { snappedIds: r.snappedIds } : {}),
  };
});
