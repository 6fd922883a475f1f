/** Runs the project's benchmarks and prints their figures.  npm run bench */
import { benchDocuments } from './bench/documents';
import { benchEngine } from './bench/engine';
import type { BenchFigure } from './bench/engine';

const benches: { name: string; run: () => Promise<BenchFigure[]> }[] = [
	{ name: 'engine', run: benchEngine },
	{ name: 'documents', run: benchDocuments },
];

let missed = 0;
for (const b of benches) {
	for (const f of await b.run()) {
		const verdict =
			f.targetMs === undefined
				? ''
				: f.medianMs < f.targetMs
					? `  (target < ${f.targetMs} ms: met)`
					: `  (target < ${f.targetMs} ms: MISSED)`;
		if (f.targetMs !== undefined && f.medianMs >= f.targetMs) missed++;
		process.stdout.write(
			`${f.name}: median ${f.medianMs} ms, min ${f.minMs}, max ${f.maxMs} over ${f.runs} runs${verdict}\n`,
		);
	}
}
if (missed > 0) process.stdout.write(`${missed} figure(s) over target\n`);
