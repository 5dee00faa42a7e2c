/** `npm run --silent analyze -- <design.matchloom.json | ->`: prints the analysis JSON of CONTRACT §3. */
import { analyze } from '../../shared/rf/analyze';
import { resultToJson } from '../../shared/rf/result';
import { readDesignArg, runCli } from './io';

runCli(async (argv) => resultToJson(analyze(await readDesignArg(argv))));
