/**
 * Circuit directory card for the panel door (NEC 408.4(A)): every position's purpose in large type,
 * spares and spaces marked, a QR code to the homeowner's panel map. Printed on a portrait page with
 * a dashed trim line; large panels continue on a second card.
 */
import { Image, Page, Text, View } from '@react-pdf/renderer';
import type { ReactElement } from 'react';
import { printable } from '../src/lib/documents/fonts';
import type { DocumentData, PaperSize } from '../src/lib/documents/types';
import type { PanelResult } from '../src/lib/electrical';
import { COLOR, PORTRAIT, longDate, packPages, s } from './common';
import { PANEL_CAUTION } from '../src/lib/cautions';
import { revisionText } from '../src/lib/documents/revision';
import { cellHeight, cellLines, GridCanvas, type GridCell, type GridRow } from './grid';
import { panelSlots, type Slot } from './PanelSchedule';

/** Trim size of the card, points: 7 in × 10 in. */
export const CARD = { width: 504, height: 720 };
const PAD = 12;
const HEAD = 58;
const FOOT = 104;
const NO_W = 24;
const AMP_W = 30;
const LABEL_SIZE = 9.5;
const LABEL_LH = 11.8;

function labelFor(slot: Slot): { text: string; color: string; bold: boolean } {
	if (slot.kind === 'space') return { text: 'SPACE (no breaker)', color: COLOR.faint, bold: false };
	if (slot.kind === 'continuation')
		return {
			text: `(with ${slot.firstPosition}: ${slot.circuit?.poles ?? 2}-pole breaker)`,
			color: COLOR.muted,
			bold: false,
		};
	if (slot.spare) return { text: slot.title, color: COLOR.copper, bold: true };
	if (slot.circuit && !slot.circuit.label.trim())
		return { text: 'NO LABEL: identify before use', color: COLOR.violation, bold: true };
	if (slot.circuit?.status === 'removed')
		return { text: `REMOVED: ${slot.circuit.label.trim()}`, color: COLOR.muted, bold: true };
	return { text: slot.title, color: COLOR.ink, bold: true };
}

function sideCells(slot: Slot | null, labelW: number): GridCell[] {
	if (!slot) return [{ lines: [] }, { lines: [] }, { lines: [] }];
	const l = labelFor(slot);
	const cells: GridCell[] = [
		{ lines: [{ text: String(slot.position), size: 11, bold: true, lineHeight: LABEL_LH }], align: 'center' },
		{ lines: cellLines(l.text, labelW, LABEL_SIZE, LABEL_LH, { bold: l.bold, color: l.color }) },
		{
			lines:
				slot.kind === 'circuit' && slot.circuit
					? [{ text: `${slot.circuit.ratingA} A`, size: 8, lineHeight: LABEL_LH, color: COLOR.muted }]
					: [],
			align: 'right',
		},
	];
	return cells;
}

interface RowBlock {
	kind: 'row';
	height: number;
	row: GridRow;
	positions: number[];
}

/** The card pages of one panel; `qrDataUrl` is the QR code of `data.mapUrl` as a PNG data URL. */
export function directoryCardPages(
	data: DocumentData,
	panelId: string,
	size: PaperSize,
	qrDataUrl: string | null,
): ReactElement[] {
	const panel = data.result.panels.find((p) => p.panelId === panelId) as PanelResult | undefined;
	if (!panel) throw new Error(`no panel ${panelId} in the job`);
	const p = data.doc.panels.find((x) => x.id === panelId)!;
	const inner = CARD.width - 2 * PAD;
	const labelW = inner / 2 - NO_W - AMP_W;
	const columns = [NO_W, labelW, AMP_W, NO_W, labelW, AMP_W];
	const slots = panelSlots(data, panel);
	const blocks: RowBlock[] = [];
	for (let i = 0; i < slots.length; i += 2) {
		const left = slots[i] ?? null;
		const right = slots[i + 1] ?? null;
		const cells = [...sideCells(left, labelW), ...sideCells(right, labelW)];
		const height = Math.max(LABEL_LH + 6, ...cells.map((c) => cellHeight(c.lines) + 1));
		blocks.push({
			kind: 'row',
			height,
			row: { height, cells },
			positions: [left?.position ?? 0, right?.position ?? 0],
		});
	}
	const capacity = CARD.height - 2 * PAD - HEAD - FOOT;
	const cards = packPages(blocks, () => capacity);
	const page = PORTRAIT[size];
	const left = (page.width - CARD.width) / 2;
	const top = 30;
	return cards.map((rows, i) => {
		const first = Math.min(...rows.flatMap((r) => r.positions.filter((x) => x > 0)));
		const last = Math.max(...rows.flatMap((r) => r.positions));
		return (
			<Page
				key={`${panelId}-card-${i}`}
				size={size === 'letter' ? 'LETTER' : 'A4'}
				style={{ ...s.page, padding: 0 }}
			>
				<Text style={{ position: 'absolute', left, top: top - 14, fontSize: 7, color: COLOR.muted }}>
					Print at 100 % (actual size) and trim on the dashed line: the card is 7 in × 10 in.
				</Text>
				<View
					style={{
						position: 'absolute',
						left,
						top,
						width: CARD.width,
						height: CARD.height,
						border: `1pt dashed ${COLOR.faint}`,
						padding: PAD,
					}}
				>
					<View
						style={{
							height: HEAD,
							flexDirection: 'row',
							justifyContent: 'space-between',
							borderBottom: `1.5pt solid ${COLOR.ink}`,
							marginBottom: 2,
						}}
					>
						<View style={{ maxWidth: 330 }}>
							<Text style={s.kicker}>Circuit directory · NEC 408.4(A)</Text>
							<Text style={{ fontSize: 17, fontWeight: 700, lineHeight: 1.2 }}>
								{printable(`${p.name}${p.location ? ` — ${p.location}` : ''}`)}
							</Text>
							<Text style={{ fontSize: 8, color: COLOR.muted }}>{printable(data.job.address)}</Text>
						</View>
						<View style={{ alignItems: 'flex-end' }}>
							<Text style={{ fontSize: 8, fontWeight: 700 }}>
								{p.mainBreakerA === null ? 'Main-lug' : `Main ${p.mainBreakerA} A`} · bus {p.busRatingA} A
							</Text>
							<Text style={{ fontSize: 8, color: COLOR.muted }}>
								Card {i + 1} of {cards.length} · positions {first}–{last}
							</Text>
						</View>
					</View>
					<GridCanvas columns={columns} rows={rows.map((r) => r.row)} />
					<View
						style={{
							position: 'absolute',
							left: PAD,
							right: PAD,
							bottom: PAD,
							height: FOOT - 6,
							flexDirection: 'row',
							borderTop: `1.5pt solid ${COLOR.ink}`,
							paddingTop: 6,
						}}
					>
						{qrDataUrl && <Image src={qrDataUrl} style={{ width: 84, height: 84, marginRight: 10 }} />}
						<View style={{ flex: 1 }}>
							<Text style={{ fontSize: 9, fontWeight: 700 }}>
								{qrDataUrl
									? 'Scan for the panel map of this home: find a breaker by room or appliance.'
									: 'Panel map: ask your electrician for the link.'}
							</Text>
							{data.mapUrl && qrDataUrl && (
								<Text style={{ fontSize: 6.5, color: COLOR.muted, marginTop: 1 }}>{data.mapUrl}</Text>
							)}
							<Text style={{ fontSize: 8.5, fontWeight: 700, color: COLOR.violation, marginTop: 5 }}>
								{PANEL_CAUTION}
							</Text>
							<Text style={{ fontSize: 7, color: COLOR.muted, marginTop: 4 }}>
								{data.firm.name} · licence {data.firm.licenceNumber}
								{data.firm.phone ? ` · ${data.firm.phone}` : ''} · {longDate(data.date)} ·{' '}
								{revisionText(data.revision, data.draft)}
							</Text>
						</View>
					</View>
				</View>
			</Page>
		);
	});
}
