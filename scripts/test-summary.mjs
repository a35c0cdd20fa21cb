// Sum the runners' JSON reports into one closing line: "tests: N passed, N failed, N skipped".
// Arguments: the artifacts folder, then the names of stages that failed (a failed stage with no
// report, such as the type check, counts as one failure so the line can never read all-green).
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const [dir, ...failedStages] = process.argv.slice(2);
const totals = { passed: 0, failed: 0, skipped: 0 };

for (const name of ['unit.json', 'integration.json']) {
	const file = join(dir, name);
	if (!existsSync(file)) continue;
	const report = JSON.parse(readFileSync(file, 'utf8'));
	totals.passed += report.numPassedTests ?? 0;
	totals.failed += report.numFailedTests ?? 0;
	totals.skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
}
const e2eFile = join(dir, 'e2e-results.json');
if (existsSync(e2eFile)) {
	const { stats } = JSON.parse(readFileSync(e2eFile, 'utf8'));
	totals.passed += stats.expected ?? 0;
	totals.failed += (stats.unexpected ?? 0) + (stats.flaky ?? 0);
	totals.skipped += stats.skipped ?? 0;
}
const unique = [...new Set(failedStages)];
if (unique.length) {
	console.log(`failed stages: ${unique.join(', ')}`);
	totals.failed = Math.max(totals.failed, unique.length);
}
if (totals.passed + totals.failed === 0) totals.failed = 1; // no test ran: never report success
console.log(`tests: ${totals.passed} passed, ${totals.failed} failed, ${totals.skipped} skipped`);
process.exit(totals.failed > 0 ? 1 : 0);
