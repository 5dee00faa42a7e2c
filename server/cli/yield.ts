/**
 * `npm run --silent yield -- <design.matchloom.json | -> [--trials 2000] [--seed 7] [--bins 20]
 *  [--sensitivity-trials N] [--no-envelope]` prints `{ "trials", "passFraction", "worstVswr", ... }`
 * (CONTRACT §3). The same seed gives the same numbers.
 */
import { yieldRun } from '../../shared/rf/yield';
import { readDesignArg, runCli } from './io';
import { flagsParsed, wholeNumber } from './match-flags';

runCli(async (argv) => {
  const { rest, flags } = flagsParsed<{ trials: number; seed: number; bins: number; 'sensitivity-trials': number; 'no-envelope': boolean }>(argv, {
    trials: wholeNumber(1, 10_000_000),
    seed: wholeNumber(0, 2 ** 32 - 1),
    bins: wholeNumber(1, 1000),
    'sensitivity-trials': wholeNumber(0, 10_000_000),
    'no-envelope': true,
  });
  const design = await readDesignArg(rest);
  const r = yieldRun(design, {
    trials: flags.trials ?? 1000,
    seed: flags.seed ?? 1,
    bins: flags.bins,
    sensitivityTrials: flags['sensitivity-trials'],
    envelope: !flags['no-envelope'],
  });
  return {
    trials: r.trials,
    seed: r.seed,
    passFraction: r.passFraction,
    worstVswr: r.worstVswr,
    worstGamma: r.worstGamma,
    histogram: r.histogram,
    sensitivity: r.sensitivity,
    nominal: r.nominal,
    variedIds: r.variedIds,
    envelope: r.envelope && {
      frequenciesHz: Array.from(r.envelope.frequenciesHz),
      minGamma: Array.from(r.envelope.minGamma),
      maxGamma: Array.from(r.envelope.maxGamma),
    },
  };
});
