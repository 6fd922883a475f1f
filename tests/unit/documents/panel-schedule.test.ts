import { describe, expect, test } from 'vitest';
import { panelSchedulePages } from '../../../templates/PanelSchedule';
import { renderPanelSchedule } from '../../../src/lib/documents/render-panel-schedule';
import { largeJob } from '../../../scripts/bench/large-job';
import { dataFor, exampleDocument } from '../../fixtures/documents';
import { overlappingItems, readPdf, squash } from '../../helpers/pdf';

const cottage = dataFor(exampleDocument('quillmere-cottage'));
const mainPanel = cottage.doc.panels[0]!;
const n = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 0 });

describe('panel schedule PDF', () => {
	test('lists every circuit of the panel with its label, rooms, breaker, conductor and leg load', async () => {
		const pages = await readPdf(await renderPanelSchedule(cottage, mainPanel.id, 'letter'));
		const text = squash(pages.map((p) => p.text).join(' '));
		const rooms = new Map(cottage.doc.rooms.map((r) => [r.id, r.name]));
		const circuits = cottage.doc.circuits.filter((c) => c.panelId === mainPanel.id && c.status !== 'removed');
		expect(circuits.length).toBeGreaterThan(5);
		for (const c of circuits) {
			expect(text).toContain(squash(c.label));
			expect(text).toContain(`${c.ratingA} A ${c.poles}P`);
			expect(text).toContain(`${c.conductor.size} AWG ${c.conductor.material === 'cu' ? 'Cu' : 'Al'}`);
			for (const id of c.roomIds) expect(text).toContain(rooms.get(id)!);
		}
		// Each position's VA on its leg is the engine's leg current × 120 V (line to neutral).
		const results = cottage.result.circuits.filter((c) => c.panelId === mainPanel.id);
		for (const r of results) for (const a of r.legAmps) expect(text).toContain(n(Math.round(a * 120)));
	});

	test('gives leg totals, connected and calculated load equal to the engine’s, and the findings', async () => {
		const pages = await readPdf(await renderPanelSchedule(cottage, mainPanel.id, 'letter'));
		const text = squash(pages.map((p) => p.text).join(' '));
		const panel = cottage.result.panels.find((p) => p.panelId === mainPanel.id)!;
		for (const leg of panel.legs) expect(text).toContain(`${n(leg.va.value)} VA`);
		expect(text).toContain(`${n(panel.connectedVA.value)} VA`);
		expect(text).toContain(`${n(panel.calculatedVA.value)} VA`);
		const findings = [
			...panel.findings,
			...cottage.result.circuits.filter((c) => c.panelId === mainPanel.id).flatMap((c) => c.findings),
		].filter((f) => f.severity !== 'ok');
		expect(findings.length).toBeGreaterThan(0);
		for (const f of findings) expect(text).toContain(squash(f.message).slice(0, 60));
	});

	test('marks the free positions as spaces and continues a 2-pole breaker on its second position', async () => {
		const pages = await readPdf(await renderPanelSchedule(cottage, mainPanel.id, 'letter'));
		const text = pages.map((p) => p.text).join(' ');
		const panel = cottage.result.panels.find((p) => p.panelId === mainPanel.id)!;
		expect((text.match(/\bSPACE\b/g) ?? []).length).toBe(panel.free);
		expect(text).toContain('Pole 2 of circuit 1');
	});

	test.each([
		['letter', 792, 612],
		['a4', 842, 595],
	] as const)(
		'prints on %s landscape with the header and "Sheet N of M" on every page',
		async (size, width, height) => {
			const pages = await readPdf(await renderPanelSchedule(cottage, mainPanel.id, size));
			pages.forEach((p, i) => {
				expect(p.width).toBeCloseTo(width, 0);
				expect(p.height).toBeCloseTo(height, 0);
				expect(p.text).toContain(
					`Sheet ${i + 1} of ${pages.length} · ${cottage.job.name} · rev ${cottage.revision}`,
				);
			});
			expect(pages[0]!.text).toContain('120/240 V single-phase 3-wire');
			expect(pages[0]!.text).toContain(`${mainPanel.busRatingA} A`);
			expect(pages[0]!.text).toContain('December 2, 2026');
		},
	);

	test('an 84-position panel with 60-character labels keeps every label whole, inside the page, with no text overlapping', async () => {
		const doc = largeJob({ circuits: 84 * 3 - 6, loads: 300, spaces: 84, labelLength: 60 });
		const data = dataFor(doc);
		const panel = doc.panels[1]!;
		const labels = doc.circuits.filter((c) => c.panelId === panel.id).map((c) => c.label);
		expect(labels.length).toBeGreaterThan(70);
		expect(labels.filter((l) => l.length === 60).length).toBeGreaterThan(60);
		for (const size of ['letter', 'a4'] as const) {
			const pages = await readPdf(await renderPanelSchedule(data, panel.id, size));
			// The pages are the ones planned: nothing spilled over onto an extra page.
			expect(pages.length).toBe(panelSchedulePages(data, panel.id, size).length);
			const text = squash(pages.map((p) => p.text).join(' '));
			for (const l of labels) expect(text).toContain(squash(l));
			for (let pos = 1; pos <= 84; pos++) expect(text).toMatch(new RegExp(`\\b${pos}\\b`));
			for (const p of pages) {
				for (const t of p.items) {
					expect(t.x).toBeGreaterThanOrEqual(20);
					expect(t.x + t.width).toBeLessThanOrEqual(p.width - 20);
					expect(t.y).toBeGreaterThanOrEqual(8);
					expect(t.y + t.height).toBeLessThanOrEqual(p.height - 20);
				}
				expect(overlappingItems(p.items)).toEqual([]);
			}
		}
	});
});
