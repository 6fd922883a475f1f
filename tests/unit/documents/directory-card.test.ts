import fs from 'node:fs';
import { describe, expect, test } from 'vitest';
import { directoryCardPages } from '../../../templates/DirectoryCard';
import { renderDirectoryCard } from '../../../src/lib/documents/render-directory-card';
import { largeJob } from '../../../scripts/bench/large-job';
import { dataFor, exampleDocument } from '../../fixtures/documents';
import { decodeQr, overlappingItems, pdfToPngs, readPdf, squash } from '../../helpers/pdf';

const link = 'https://ampledger.example/map/Qm9ndXMtdG9rZW4tZm9yLXRlc3RzLTAx';
const cottage = dataFor(exampleDocument('quillmere-cottage'), { mapUrl: link });
const mainPanel = cottage.doc.panels[0]!;

describe('directory card PDF', () => {
	test('names every position’s purpose, marks spaces, and carries the cautions', async () => {
		const pages = await readPdf(await renderDirectoryCard(cottage, mainPanel.id));
		const text = squash(pages.map((p) => p.text).join(' '));
		for (const c of cottage.doc.circuits.filter((x) => x.panelId === mainPanel.id))
			expect(text).toContain(squash(c.label));
		const panel = cottage.result.panels.find((p) => p.panelId === mainPanel.id)!;
		expect((text.match(/SPACE \(no breaker\)/g) ?? []).length).toBe(panel.free);
		expect(text).toContain('NEC 408.4(A)');
		expect(text).toContain('Switch the breaker off and verify with a tester before any work.');
		expect(text).toContain('Work inside a panelboard is for licensed electricians.');
		expect(text).toContain(`Sheet 1 of ${pages.length}`);
	});

	test('its QR code, read from the printed page, opens the panel map link', async () => {
		const [png] = pdfToPngs(await renderDirectoryCard(cottage, mainPanel.id), 150, 1, 1);
		expect(await decodeQr(png!)).toBe(link);
		fs.rmSync(png!, { force: true });
	});

	test('without a link the card says to ask for one and has no code', async () => {
		const data = dataFor(exampleDocument('quillmere-cottage'), { mapUrl: null });
		const bytes = await renderDirectoryCard(data, mainPanel.id);
		expect(squash((await readPdf(bytes))[0]!.text)).toContain(
			'Panel map: ask your electrician for the link.',
		);
		const [png] = pdfToPngs(bytes, 150, 1, 1);
		expect(await decodeQr(png!)).toBeNull();
	});

	test('spares are marked as spares', async () => {
		const doc = largeJob();
		const data = dataFor(doc, { mapUrl: link });
		const spare = doc.circuits.find((c) => c.label === 'Spare')!;
		const text = squash(
			(await readPdf(await renderDirectoryCard(data, spare.panelId))).map((p) => p.text).join(' '),
		);
		expect(text).toMatch(/\bSPARE\b/);
	});

	test('an 84-position panel with 60-character labels continues on a second card with every label whole and inside the trim line', async () => {
		const doc = largeJob({ circuits: 84 * 3 - 6, loads: 300, spaces: 84, labelLength: 60 });
		const data = dataFor(doc, { mapUrl: link });
		const panel = doc.panels[2]!;
		const bytes = await renderDirectoryCard(data, panel.id);
		const pages = await readPdf(bytes);
		expect(pages.length).toBe(directoryCardPages(data, panel.id, 'letter', 'data:').length);
		expect(pages.length).toBeGreaterThan(1);
		const text = squash(pages.map((p) => p.text).join(' '));
		for (const c of doc.circuits.filter((x) => x.panelId === panel.id))
			expect(text).toContain(c.label === 'Spare' ? 'SPARE' : squash(c.label));
		const left = (612 - 504) / 2;
		for (const p of pages) {
			// Card text sits inside the 7 in × 10 in trim box (PDF y runs up from the foot of the page).
			const inside = p.items.filter((t) => !t.str.startsWith('Sheet ') && !t.str.startsWith('Print at'));
			for (const t of inside) {
				expect(t.x).toBeGreaterThanOrEqual(left);
				expect(t.x + t.width).toBeLessThanOrEqual(left + 504);
				expect(t.y).toBeGreaterThanOrEqual(792 - 30 - 720);
			}
			expect(overlappingItems(p.items)).toEqual([]);
		}
		for (const png of pdfToPngs(bytes, 150)) expect(await decodeQr(png)).toBe(link);
	});
});
