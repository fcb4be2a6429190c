// Benchmark runner (`npm run bench`): runs every case of every module listed below, one after another, and
// prints one JSON line per case. Adding a module is one line in MODULES. Kept apart from the tests: figures,
// not assertions. Modules load lazily and in order, so no case competes with another for the cores.

/** One benchmark case: run() does the work and returns the figures to print (ms included). */
export interface BenchCase {
	name: string;
	run(): Record<string, number> | Promise<Record<string, number>>;
}

const MODULES: (() => Promise<{ default: BenchCase[] }>)[] = [
	() => import('./variogram'),
	() => import('./variogram-fit'),
	() => import('./simulation'),
	() => import('./soundings-storage'),
	() => import('./contacts'),
	() => import('./import-latency'),
	() => import('./demo-run'),
	() => import('./browser-run'),
	() => import('./exports'),
	() => import('./weak-zones'),
	() => import('./queue')
];

const only = process.argv[2];
for (const load of MODULES) {
	for (const c of (await load()).default) {
		if (only && !c.name.startsWith(only)) continue;
		console.log(JSON.stringify({ case: c.name, ...(await c.run()) }));
	}
}
