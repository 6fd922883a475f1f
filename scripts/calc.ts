/**
 * Runs the calculation engine on a job file.
 *   npm run calc -- path/to/job.json [--format json|text]
 * Exit 0 with the results on stdout; 2 with the messages on stderr when the input is unreadable or invalid.
 */
import { readFileSync } from 'node:fs';
import { computeJob, formatJobReport, parseJobDocument } from '../src/lib/electrical/index';

const USAGE = 'usage: npm run calc -- <job.json> [--format json|text]';

function fail(messages: string[]): never {
	for (const m of messages) process.stderr.write(`${m}\n`);
	process.exit(2);
}

function main(argv: string[]): void {
	let format: 'json' | 'text' = 'json';
	let file: string | null = null;
	for (let i = 0; i < argv.length; i++) {
		const a = argv[i] as string;
		if (a === '--format') {
			const v = argv[++i];
			if (v !== 'json' && v !== 'text') fail([`--format must be json or text`, USAGE]);
			format = v;
		} else if (a.startsWith('--format=')) {
			const v = a.slice('--format='.length);
			if (v !== 'json' && v !== 'text') fail([`--format must be json or text`, USAGE]);
			format = v;
		} else if (a === '--help' || a === '-h') {
			process.stdout.write(`${USAGE}\n`);
			return;
		} else if (a.startsWith('-')) fail([`unknown option ${a}`, USAGE]);
		else if (file === null) file = a;
		else fail(['give one job file', USAGE]);
	}
	if (file === null) fail(['no job file given', USAGE]);
	let text: string;
	try {
		text = readFileSync(file, 'utf8');
	} catch (e) {
		fail([`${file}: cannot read the file (${(e as NodeJS.ErrnoException).code ?? 'error'})`]);
	}
	let json: unknown;
	try {
		json = JSON.parse(text);
	} catch (e) {
		fail([`${file}: not valid JSON (${(e as Error).message})`]);
	}
	const parsed = parseJobDocument(json);
	if (!parsed.ok) fail([`${file}: the job document is not valid:`, ...parsed.errors.map((m) => `  ${m}`)]);
	const result = computeJob(parsed.doc);
	process.stdout.write(
		format === 'text' ? `${formatJobReport(result)}\n` : `${JSON.stringify(result, null, 2)}\n`,
	);
}

main(process.argv.slice(2));
