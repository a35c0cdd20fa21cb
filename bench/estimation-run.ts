/**
 * `npx tsx bench/estimation-run.ts [--quick] [--only defocus,sharp]`: the blur-estimation benchmark
 * on its own, optionally only some of its parts (motion, defocus, sharp, gaussian, noise, timing).
 */
import { parseArgs } from 'node:util';
import { ESTIMATION_PARTS, runEstimationBench, type EstimationPart } from './estimation';

const { values } = parseArgs({ options: { quick: { type: 'boolean' }, only: { type: 'string' } } });
const parts = values.only?.split(',').map((p) => p.trim());
const unknown = parts?.filter((p) => !(ESTIMATION_PARTS as readonly string[]).includes(p));
if (unknown?.length) throw new RangeError(`unknown part(s) ${unknown.join(', ')}; choose from ${ESTIMATION_PARTS.join(', ')}`);
process.stdout.write(`${await runEstimationBench({ perBand: values.quick ? 4 : 12, parts: parts as EstimationPart[] | undefined })}\n`);
