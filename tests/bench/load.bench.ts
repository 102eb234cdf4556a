// `npm run bench` entry for the HTTP load test: the same run as `npm run load` (tests/bench/load.ts),
// which writes tests/bench/results/load.json for the bench summary.
import { runLoad } from './load';

await runLoad();
