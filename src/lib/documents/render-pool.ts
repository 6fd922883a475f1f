/**
 * Renders documents in a worker thread so that a packet (a second or so of layout) does not hold up
 * other requests. The worker is started on first use and kept; it runs the TypeScript sources with
 * tsx, as the server does. Where no worker can start (no sources beside the build), rendering
 * happens in this thread instead.
 */
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { Worker } from 'node:worker_threads';
import type { DocumentData } from './types';
import { renderHere, type RenderRequest } from './render-document';

/**
 * A request as it crosses to the worker: without the engine's result, whose texts are getters that
 * structured clone drops. The worker computes the result again from the document (plain data).
 */
export type WorkerRequest = RenderRequest extends infer R
	? R extends { data: DocumentData }
		? Omit<R, 'data'> & { data: Omit<DocumentData, 'result'> }
		: never
	: never;

interface Pending {
	resolve: (bytes: Uint8Array) => void;
	reject: (err: Error) => void;
	timer: NodeJS.Timeout;
}

const TIMEOUT_MS = 120_000;
/** A worker is replaced after this many renders, so a slow leak in a library cannot grow forever. */
const RECYCLE_AFTER = 500;

let worker: Worker | null = null;
let served = 0;
let nextId = 1;
let disabled = false;
const pending = new Map<number, Pending>();

function workerFile(): string | null {
	const file = path.join(
		process.env.AMPLEDGER_ROOT ?? process.cwd(),
		'src',
		'lib',
		'documents',
		'render-worker.ts',
	);
	return fs.existsSync(file) ? file : null;
}

function failAll(err: Error) {
	for (const [id, p] of pending) {
		clearTimeout(p.timer);
		p.reject(err);
		pending.delete(id);
	}
}

function start(): Worker | null {
	if (disabled) return null;
	const file = workerFile();
	if (!file) {
		disabled = true;
		return null;
	}
	// Node 20 does not apply --import to a worker's entry, so a short script registers tsx first.
	const root = process.env.AMPLEDGER_ROOT ?? process.cwd();
	const api = pathToFileURL(
		path.join(
			path.dirname(createRequire(path.join(root, 'package.json')).resolve('tsx/esm/api')),
			'index.mjs',
		),
	).href;
	const boot = `import(${JSON.stringify(api)}).then((m) => { m.register(); return import(${JSON.stringify(pathToFileURL(file).href)}); })`;
	const w = new Worker(boot, { eval: true });
	w.unref();
	w.on('message', (msg: { id?: number; ok?: boolean; bytes?: Uint8Array; message?: string }) => {
		if (msg.id === undefined) return;
		const p = pending.get(msg.id);
		if (!p) return;
		pending.delete(msg.id);
		clearTimeout(p.timer);
		if (msg.ok && msg.bytes) p.resolve(msg.bytes);
		else p.reject(new Error(msg.message ?? 'rendering failed'));
	});
	w.on('error', (err: Error) => {
		console.error('[ampledger] documents worker failed', err);
		failAll(err);
		if (worker === w) worker = null;
	});
	w.on('exit', () => {
		if (worker === w) worker = null;
		failAll(new Error('the documents worker stopped'));
	});
	served = 0;
	return w;
}

/** Renders a document off the main thread (or here when no worker can run). */
export async function renderDocument(request: RenderRequest): Promise<Uint8Array> {
	if (worker && served >= RECYCLE_AFTER && pending.size === 0) {
		void worker.terminate();
		worker = null;
	}
	worker ??= start();
	if (!worker) return renderHere(request);
	const w = worker;
	served++;
	const id = nextId++;
	return new Promise<Uint8Array>((resolve, reject) => {
		const timer = setTimeout(() => {
			pending.delete(id);
			reject(new Error('rendering took too long'));
		}, TIMEOUT_MS);
		pending.set(id, { resolve, reject, timer });
		const { result: _result, ...data } = request.data;
		const message: { id: number; request: WorkerRequest } = { id, request: { ...request, data } };
		w.postMessage(message);
	});
}

/** Starts the worker ahead of need (the job page's documents section asks for it when it opens). */
export function warmRenderWorker(): void {
	worker ??= start();
}

/** Stops the worker (tests, shutdown). */
export async function stopRenderWorker(): Promise<void> {
	const w = worker;
	worker = null;
	if (w) await w.terminate();
}
