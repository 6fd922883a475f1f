import type { Knex } from 'knex';
import { createHash } from 'node:crypto';
import fs from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { insertSketches } from '../src/lib/repositories/sketches.ts';
import {
	jobFolder,
	newStoredName,
	sketchPaths,
	THUMBNAIL_WIDTH,
	uploadsRoot,
} from '../src/lib/sketch-storage.ts';
import { DEMO_ACCOUNTS, DEMO_FIRM } from './data/demo-accounts.ts';
import { DEMO_JOB_DOCUMENT } from './data/demo-job.ts';

/** The demo job's floor-plan sketches, drawn for the demo by scripts/render-demo-sketches.ts. */
const DEMO_SKETCHES = [
	{
		file: 'first-floor.png',
		room: 'Kitchen',
		caption: 'First floor and garage: kitchen remodel, EV charger location',
	},
	{ file: 'basement.png', room: 'Basement', caption: 'Basement: main panel on the north wall' },
];

const UUID_FOLDER = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/;

/** Copies the demo sketches into UPLOADS_DIR beside the demo job and records them. */
export async function seed(knex: Knex): Promise<void> {
	if (process.env.NODE_ENV === 'production' && process.env.AMPLEDGER_ALLOW_DEMO !== '1') {
		throw new Error(
			'The demo seed is not for production databases (set AMPLEDGER_ALLOW_DEMO=1 to override).',
		);
	}
	const job = await knex('jobs as j')
		.join('firms as f', 'f.id', 'j.firm_id')
		.where({ 'j.name': DEMO_JOB_DOCUMENT.name, 'f.name': DEMO_FIRM.name })
		.first('j.id');
	if (!job)
		throw new Error('The demo job is missing: run the seeds in order (02_demo_job before 03_demo_sketches).');
	const owner = await knex('users').where({ email: DEMO_ACCOUNTS.owner.email }).first('id');

	// The earlier seeds emptied the jobs table, so folders of jobs that no longer exist hold only orphans.
	const jobIds = new Set<string>(await knex('jobs').pluck('id'));
	const root = uploadsRoot();
	for (const entry of await fs.readdir(root).catch(() => [] as string[])) {
		if (UUID_FOLDER.test(entry) && !jobIds.has(entry))
			await fs.rm(path.join(root, entry), { recursive: true, force: true });
	}
	await fs.rm(jobFolder(job.id), { recursive: true, force: true });
	await fs.mkdir(jobFolder(job.id), { recursive: true });

	const written: string[] = [];
	try {
		await knex.transaction(async (trx) => {
			await trx('sketches').where({ job_id: job.id }).delete();
			for (const s of DEMO_SKETCHES) {
				const source = path.join(import.meta.dirname, 'data', 'sketches', s.file);
				const bytes = await fs.readFile(source);
				const meta = await sharp(bytes).metadata();
				const stored = newStoredName('image/png');
				const paths = sketchPaths({ job_id: job.id, stored_name: stored });
				written.push(paths.file, paths.thumbnail);
				await fs.writeFile(paths.file, bytes);
				await sharp(bytes)
					.resize({ width: THUMBNAIL_WIDTH, withoutEnlargement: true })
					.png()
					.toFile(paths.thumbnail);
				const room = await trx('rooms').where({ job_id: job.id, name: s.room }).first('id');
				await insertSketches(trx, job.id, owner.id, [
					{
						room_id: room?.id ?? null,
						caption: s.caption,
						original_name: s.file,
						stored_name: stored,
						content_type: 'image/png',
						size_bytes: bytes.byteLength,
						sha256: createHash('sha256').update(bytes).digest('hex'),
						width: meta.width,
						height: meta.height,
						page_count: null,
						has_thumbnail: true,
					},
				]);
			}
		});
	} catch (err) {
		await Promise.all(written.map((f) => fs.rm(f, { force: true })));
		throw err;
	}
}
