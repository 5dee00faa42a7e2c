/**
 * The Matchloom RF engine: pure TypeScript (no DOM, no I/O), run alike by the browser worker,
 * the server, the command line and the tests. See README.md in this folder for the conventions.
 */
export * from './design';
export * from './complex';
export * from './abcd';
export * from './frequency';
export * from './loads';
export * from './elements';
export * from './cascade';
export * from './figures';
export * from './bandwidth';
export * from './limit';
export * from './stress';
export * from './analyze';
export * from './result';
export * from './touchstone';
export * from './units';
export * from './impedance-path';
export * from './eseries';
export * from './microstrip';
