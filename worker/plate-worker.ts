/**
 * The plate-analysis worker's entry: it exposes plate-api.ts over comlink. The app takes the API's
 * type from here (`wrap<PlateWorkerApi>()`), so there is one definition of it.
 */
import { expose } from 'comlink';
import { plateApi } from './plate-api.ts';

export type PlateWorkerApi = typeof plateApi;

expose(plateApi);
