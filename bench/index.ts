// Benchmark runner (`npm run bench`): runs every case of every module listed below and prints one JSON line
// per case. Adding a module is one line in MODULES. Kept apart from the tests: figures, not assertions.

/** One benchmark case: run() does the work and returns the figures to print (ms included). */
export interface BenchCase {
	name: string;
	run(): Record<string, number>;
}

const MODULES: Promise<{ default: BenchCase[] }>[] = [
	import('./simulation'),
	import('./variogram'),
];

for (const mod of await Promise.all(MODULES)) {
	for (const c of mod.default) console.log(JSON.stringify({ case: c.name, ...c.run() }));
}
