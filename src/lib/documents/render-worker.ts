/** The documents worker thread: renders requests from the pool one after another. */
import { parentPort } from 'node:worker_threads';
import { Page, Text } from '@react-pdf/renderer';
import { createElement } from 'react';
import { computeJob } from '../electrical';
import { renderSheets } from './assemble';
import { renderHere, type RenderRequest } from './render-document';
import type { WorkerRequest } from './render-pool';

async function warmUp(): Promise<void> {
	await renderSheets(
		[createElement(Page, { size: 'LETTER' }, createElement(Text, null, 'warm-up'))],
		'warm-up',
		'Ampledger',
	);
}

parentPort?.on('message', async (msg: { id: number; request: WorkerRequest }) => {
	try {
		const data = msg.request.data;
		const request = { ...msg.request, data: { ...data, result: computeJob(data.doc) } } as RenderRequest;
		const bytes = await renderHere(request);
		const copy = new Uint8Array(bytes);
		parentPort!.postMessage({ id: msg.id, ok: true, bytes: copy }, [copy.buffer]);
	} catch (err) {
		parentPort!.postMessage({
			id: msg.id,
			ok: false,
			message: err instanceof Error ? (err.stack ?? err.message) : String(err),
		});
	}
});
parentPort?.postMessage({ ready: true });

// Load the fonts and the layout engine now, so the first real document does not wait for them.
void warmUp().catch(() => undefined);
