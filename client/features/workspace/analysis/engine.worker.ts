/**
 * The engine in a Web Worker: routes comlink calls to the same shared/rf code the main thread runs
 * (engine-core.ts via engine-worker-api.ts). Results travel back with their buffers transferred.
 */
import * as Comlink from 'comlink';
import { z } from 'zod';
import { engineWorkerApi } from './engine-worker-api';

z.config({ jitless: true }); // no eval under the content security policy

Comlink.expose(engineWorkerApi());
