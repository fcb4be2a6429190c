// `npm run fuzz [count] [seed]`: seeded malformed and valid CSV/GEF/AGS4 uploads through the import service
// (tests/server/services/import-fuzz.ts), then one JSON line of figures. Exits 1 on any crash or partial write.
import { FUZZ_SEED, runFuzz } from '../tests/server/services/import-fuzz';

const total = Number(process.argv[2] ?? 10_000);
const seed = process.argv[3] ?? FUZZ_SEED;
const started = performance.now();
const tally = runFuzz(0, total, {
	seed,
	onProgress: (done) => {
		if (done % 1000 === 0) process.stderr.write(`  ${done} / ${total}\n`);
	}
});
const { failures, codes, ...figures } = tally;
console.log(JSON.stringify({ seed, ...figures, seconds: Math.round((performance.now() - started) / 100) / 10, refusedByCode: codes }));
for (const f of failures) console.error(`case ${f.index} (${f.kind}): ${f.detail}`);
process.exit(tally.crashes + tally.partialWrites > 0 ? 1 : 0);
