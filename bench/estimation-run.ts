/** `npx tsx bench/estimation-run.ts [--quick]`: the blur-estimation benchmark on its own. */
import { parseArgs } from 'node:util';
import { runEstimationBench } from './estimation';

const { values } = parseArgs({ options: { quick: { type: 'boolean' } } });
process.stdout.write(`${await runEstimationBench({ perBand: values.quick ? 4 : 12 })}\n`);
