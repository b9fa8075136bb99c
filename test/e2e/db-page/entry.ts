// Test-only page script: the real src/db module, bundled by Vite for Chromium, reachable from
// the browser tests and benchmarks through `window.floeDbPage`. It is never part of the app build.
import * as db from '../../../src/db';
import * as bench from './bench';
import { CRUISE_INPUT } from '../../db/fixtures/demo-cruise';

const api = { db, bench, cruiseInput: CRUISE_INPUT };
export type DbPageApi = typeof api;
(window as unknown as { floeDbPage: DbPageApi }).floeDbPage = api;
document.body.dataset.ready = 'yes';
