import { spawnSync } from 'node:child_process';

/** Debian's interpreter: it carries python3-skimage; a pyenv `python3` on PATH may not. */
export const PYTHON = '/usr/bin/python3';

/** Versions of the reference stack, or null (with the reason) when it cannot be used. */
export function pythonReference(): { versions: { skimage: string; scipy: string; numpy: string } } | { missing: string } {
	const r = spawnSync(PYTHON, ['-c', 'import json, numpy, scipy, skimage; print(json.dumps({"skimage": skimage.__version__, "scipy": scipy.__version__, "numpy": numpy.__version__}))'], {
		encoding: 'utf8'
	});
	if (r.error) return { missing: `${PYTHON} not runnable (${r.error.message})` };
	if (r.status !== 0) return { missing: `${PYTHON} lacks numpy/scipy/skimage (apt-get install python3-skimage)` };
	return { versions: JSON.parse(r.stdout) };
}

/** Run a committed reference script; its stdout is one JSON document, its stderr passes through. */
export function runPython<T>(script: string, args: string[]): T {
	const r = spawnSync(PYTHON, [script, ...args], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024, stdio: ['ignore', 'pipe', 'inherit'] });
	if (r.error) throw r.error;
	if (r.status !== 0) throw new Error(`${script} exited with status ${r.status}`);
	return JSON.parse(r.stdout) as T;
}
