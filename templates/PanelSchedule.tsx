/** Panel schedule: every position of a panelboard in its two columns, leg totals, loads and findings. */
import { Text, View } from '@react-pdf/renderer';
import type { ReactElement } from 'react';
import { printable, wrapText } from '../src/lib/documents/fonts';
import { cellHeight, cellLines, GridCanvas, type GridCell, type GridRow, type GridText } from './grid';
import type { DocumentData, PaperSize } from '../src/lib/documents/types';
import type { Circuit, CircuitResult, Finding, PanelResult } from '../src/lib/electrical';
import { revisionText } from '../src/lib/documents/revision';
import {
	COLOR,
	Field,
	SEVERITY_LABEL,
	Sheet,
	contentHeight,
	contentWidth,
	longDate,
	n,
	packPages,
	s,
	VOLTAGE_LABEL,
	worstFirst,
} from './common';

const BREAKER_TYPE: Record<Circuit['breakerType'], string> = {
	standard: 'Standard',
	afci: 'AFCI',
	gfci: 'GFCI',
	'dual-function': 'AFCI/GFCI',
	gfpe: 'GFPE',
};

const COL = { ckt: 20, breaker: 58, wire: 54, va: 46, leg: 26 };
const LABEL_SIZE = 7.5;
const LABEL_LH = 9.4;
const SUB_SIZE = 6.5;
const SUB_LH = 8.2;
const ROW_PAD = 5;
const MIN_ROW = 2 * SUB_LH + ROW_PAD + 1;
const HEADER_FIRST = 96;
const HEADER_NEXT = 30;
const TABLE_HEAD = 16;
const SUMMARY = 66;
const FINDING_SIZE = 7.5;
const FINDING_LH = 9.6;

/** What one position of the schedule shows. */
export interface Slot {
	position: number;
	leg: string;
	kind: 'circuit' | 'continuation' | 'space';
	circuit: Circuit | null;
	result: CircuitResult | null;
	/** The breaker's first position, for continuation slots. */
	firstPosition: number | null;
	spare: boolean;
	title: string;
	detail: string;
	va: number | null;
}

function isSpare(c: Circuit, r: CircuitResult | null): boolean {
	return (
		/\bspare\b/i.test(c.label) ||
		(c.label.trim() === '' && (r?.connectedVA.value ?? 0) === 0 && !r?.feedsPanelId)
	);
}

/** The slots of a panel, position by position, from the engine's result. */
export function panelSlots(data: DocumentData, panel: PanelResult): Slot[] {
	const circuits = new Map(data.doc.circuits.map((c) => [c.id, c]));
	const results = new Map(data.result.circuits.map((r) => [r.circuitId, r]));
	const rooms = new Map(data.doc.rooms.map((r) => [r.id, r.name]));
	const panels = new Map(data.doc.panels.map((p) => [p.id, p.name]));
	return panel.positions.map((slot) => {
		const c = slot.circuitId ? (circuits.get(slot.circuitId) ?? null) : null;
		if (!c) {
			return {
				position: slot.position,
				leg: slot.leg,
				kind: 'space',
				circuit: null,
				result: null,
				firstPosition: null,
				spare: false,
				title: 'SPACE',
				detail: '',
				va: null,
			};
		}
		const r = results.get(c.id) ?? null;
		const index = r ? r.positions.indexOf(slot.position) : 0;
		const legVA = r ? Math.round((r.legAmps[index] ?? 0) * 120) : null;
		if (index > 0) {
			return {
				position: slot.position,
				leg: slot.leg,
				kind: 'continuation',
				circuit: c,
				result: r,
				firstPosition: c.position,
				spare: false,
				title: `Pole ${index + 1} of circuit ${c.position}`,
				detail: '',
				va: legVA,
			};
		}
		const spare = isSpare(c, r);
		const roomNames = c.roomIds.map((id) => rooms.get(id)).filter(Boolean);
		const parts: string[] = [];
		if (c.status !== 'existing') parts.push(c.status === 'removed' ? 'REMOVED' : c.status.toUpperCase());
		if (r?.feedsPanelId) parts.push(`Feeds panel ${panels.get(r.feedsPanelId) ?? r.feedsPanelId}`);
		if (roomNames.length) parts.push(`Rooms: ${roomNames.join(', ')}`);
		return {
			position: slot.position,
			leg: slot.leg,
			kind: 'circuit',
			circuit: c,
			result: r,
			firstPosition: c.position,
			spare,
			title: spare
				? `SPARE${c.label.trim() && !/^spare$/i.test(c.label.trim()) ? ` — ${c.label.trim()}` : ''}`
				: c.label.trim() || '(no label)',
			detail: parts.join(' · '),
			va: legVA,
		};
	});
}

function descWidth(size: PaperSize): number {
	return (contentWidth(size) - COL.leg - 2 * (COL.ckt + COL.breaker + COL.wire + COL.va)) / 2;
}

function columnsFor(size: PaperSize): number[] {
	const d = descWidth(size);
	return [COL.ckt, d, COL.breaker, COL.wire, COL.va, COL.leg, COL.va, COL.wire, COL.breaker, d, COL.ckt];
}

interface RowBlock {
	kind: 'row';
	height: number;
	row: GridRow;
}
interface SummaryBlock {
	kind: 'summary';
	height: number;
}
interface FindingBlock {
	kind: 'finding';
	height: number;
	finding: Finding;
	lines: string[];
	heading: boolean;
}
type Block = RowBlock | SummaryBlock | FindingBlock;

const sub = (text: string, width: number, opts: { bold?: boolean; color?: string } = {}) =>
	cellLines(text, width, SUB_SIZE, SUB_LH, opts);

/** The cells of one side of a row, left to right (mirrored for the right side). */
function slotCells(slot: Slot | null, size: PaperSize, mirror: boolean): GridCell[] {
	const d = descWidth(size);
	const c = slot?.kind === 'circuit' ? slot.circuit : null;
	const titleColor = !slot || slot.kind !== 'circuit' ? COLOR.faint : slot.spare ? COLOR.copper : COLOR.ink;
	const desc: GridText[] = slot
		? [
				...cellLines(slot.title, d, LABEL_SIZE, LABEL_LH, {
					bold: slot.kind === 'circuit',
					color: titleColor,
				}),
				...(slot.detail ? sub(slot.detail, d, { color: COLOR.muted }) : []),
			]
		: [];
	const cells: GridCell[] = [
		{ lines: slot ? [{ text: String(slot.position), size: 8, bold: true, lineHeight: LABEL_LH }] : [] },
		{ lines: desc },
		{
			lines: c
				? [
						...sub(`${c.ratingA} A ${c.poles}P`, COL.breaker, { bold: true }),
						...sub(BREAKER_TYPE[c.breakerType], COL.breaker),
					]
				: [],
		},
		{
			lines: c
				? [
						...sub(`${c.conductor.size} AWG ${c.conductor.material === 'cu' ? 'Cu' : 'Al'}`, COL.wire),
						...sub(`${c.conductor.insulationC} °C · ${n(c.lengthFt)} ft`, COL.wire, { color: COLOR.muted }),
					]
				: [],
		},
		{
			lines:
				slot?.va !== null && slot?.va !== undefined
					? [{ text: n(slot.va), size: 7.5, lineHeight: LABEL_LH }]
					: [],
			align: 'right',
		},
	];
	return mirror ? cells.reverse() : cells;
}

function headRow(legs: number): GridRow {
	const h = (text: string, align: GridCell['align'] = 'left'): GridCell => ({
		lines: [{ text, size: 6.5, bold: true, color: '#ffffff', lineHeight: 10 }],
		align,
	});
	const side = [
		h('Ckt'),
		h('Circuit (label · rooms)'),
		h('Breaker'),
		h('Conductor'),
		h('VA on leg', 'right'),
	];
	return {
		height: TABLE_HEAD,
		fill: COLOR.ink,
		border: 'none',
		cells: [...side, h(legs === 3 ? 'Phase' : 'Leg', 'center'), ...[...side].reverse()],
	};
}

function tableRow(left: Slot | null, right: Slot | null, size: PaperSize): GridRow {
	const leg = left?.leg ?? right?.leg ?? '';
	const cells = [
		...slotCells(left, size, false),
		{
			lines: [{ text: leg, size: 9, bold: true, lineHeight: 11 }],
			align: 'center' as const,
			fill: COLOR.shade,
		},
		...slotCells(right, size, true),
	];
	const height = Math.max(MIN_ROW, ...cells.map((c) => cellHeight(c.lines)));
	return { height, cells };
}

/** The findings of a panel and of the circuits in it, worst first, passed checks left out. */
export function panelFindings(data: DocumentData, panel: PanelResult): Finding[] {
	const circuitFindings = data.result.circuits
		.filter((c) => c.panelId === panel.panelId)
		.flatMap((c) => c.findings);
	return worstFirst([...panel.findings, ...circuitFindings].filter((f) => f.severity !== 'ok'));
}

function findingText(f: Finding): string {
	return `${SEVERITY_LABEL[f.severity]}: ${f.message} [${f.rule}]`;
}

function blocksFor(data: DocumentData, panel: PanelResult, size: PaperSize): Block[] {
	const slots = panelSlots(data, panel);
	const blocks: Block[] = [];
	for (let i = 0; i < slots.length; i += 2) {
		const row = tableRow(slots[i] ?? null, slots[i + 1] ?? null, size);
		blocks.push({ kind: 'row', row, height: row.height });
	}
	blocks.push({ kind: 'summary', height: SUMMARY });
	const findings = panelFindings(data, panel);
	findings.forEach((f, i) => {
		const lines = wrapText(findingText(f), (contentWidth(size) - 10) * 0.97, FINDING_SIZE);
		blocks.push({
			kind: 'finding',
			finding: f,
			lines,
			heading: i === 0,
			height: lines.length * FINDING_LH + 3 + (i === 0 ? 18 : 0),
		});
	});
	if (findings.length === 0) {
		blocks.push({
			kind: 'finding',
			finding: {
				severity: 'ok',
				code: 'none',
				message: 'No warnings or violations for this panel and its circuits.',
				rule: 'computed checks',
				target: { kind: 'panel', id: panel.panelId },
			},
			lines: ['No warnings or violations for this panel and its circuits.'],
			heading: true,
			height: FINDING_LH + 3 + 18,
		});
	}
	return blocks;
}

function fedFrom(data: DocumentData, panel: PanelResult): string {
	if (!panel.feederCircuitId) return `Service (${data.doc.service.ratingA} A)`;
	const c = data.doc.circuits.find((x) => x.id === panel.feederCircuitId);
	const p = c ? data.doc.panels.find((x) => x.id === c.panelId) : null;
	return c
		? `Panel ${p?.name ?? c.panelId}, circuit ${c.position}${c.poles > 1 ? `/${c.position + 2}` : ''} (${c.ratingA} A)`
		: panel.feederCircuitId;
}

function Header({
	data,
	panel,
	first,
	page,
	pages,
}: {
	data: DocumentData;
	panel: PanelResult;
	first: boolean;
	page: number;
	pages: number;
}) {
	const p = data.doc.panels.find((x) => x.id === panel.panelId)!;
	if (!first) {
		return (
			<View
				style={{
					height: HEADER_NEXT,
					flexDirection: 'row',
					justifyContent: 'space-between',
					borderBottom: `1pt solid ${COLOR.ink}`,
					marginBottom: 4,
				}}
			>
				<Text style={{ fontSize: 11, fontWeight: 700 }}>
					Panel schedule: {printable(panel.name)} (continued, page {page} of {pages})
				</Text>
				<Text style={{ fontSize: 8, color: COLOR.muted }}>{printable(data.job.name)}</Text>
			</View>
		);
	}
	const main =
		panel.mainBreakerA === null ? 'Main-lug (no main breaker)' : `${panel.mainBreakerA} A main breaker`;
	return (
		<View style={{ height: HEADER_FIRST, borderBottom: `1pt solid ${COLOR.ink}`, marginBottom: 4 }}>
			<View style={{ flexDirection: 'row', justifyContent: 'space-between', marginBottom: 4 }}>
				<View>
					<Text style={s.kicker}>Panel schedule{pages > 1 ? ` · page 1 of ${pages}` : ''}</Text>
					<Text style={s.h1}>{printable(`${panel.name}${p.location ? ` — ${p.location}` : ''}`)}</Text>
				</View>
				<View style={{ alignItems: 'flex-end', maxWidth: 320 }}>
					<Text style={{ fontSize: 9, fontWeight: 700 }}>{printable(data.job.name)}</Text>
					<Text style={{ fontSize: 8, color: COLOR.muted }}>{printable(data.job.address)}</Text>
				</View>
			</View>
			<View style={{ flexDirection: 'row', flexWrap: 'wrap' }}>
				<Field width="20%" label="Voltage system" value={VOLTAGE_LABEL[panel.voltageSystem]} />
				<Field width="14%" label="Bus rating" value={`${panel.busRatingA} A`} />
				<Field width="20%" label="Main" value={main} />
				<Field width="30%" label="Fed from" value={fedFrom(data, panel)} />
				<Field width="16%" label="Kind" value={panel.kind === 'main' ? 'Main panelboard' : 'Subpanel'} />
				<Field
					width="20%"
					label="Spaces"
					value={`${panel.spaces} (${panel.used} used, ${panel.free} free)`}
				/>
				<Field width="14%" label="Code edition" value={`NEC ${data.doc.codeEdition}`} />
				<Field width="20%" label="Date" value={longDate(data.date)} />
				<Field width="30%" label="Revision" value={revisionText(data.revision, data.draft)} />
				<Field width="16%" label="Permit" value={data.job.permitNumber || 'not yet issued'} />
			</View>
		</View>
	);
}

function Summary({ panel }: { panel: PanelResult }) {
	const box = {
		borderRight: `0.5pt solid ${COLOR.rule}`,
		paddingHorizontal: 5,
		paddingVertical: 3,
		flexGrow: 1,
		flexBasis: 0,
	};
	const label = { fontSize: 6, color: COLOR.muted, textTransform: 'uppercase' as const };
	const big = { fontSize: 10, fontWeight: 700 };
	return (
		<View
			style={{ height: SUMMARY - 6, marginTop: 6, flexDirection: 'row', border: `1pt solid ${COLOR.ink}` }}
			wrap={false}
		>
			{panel.legs.map((l) => (
				<View key={l.leg} style={box}>
					<Text style={label}>
						{panel.legs.length === 3 ? 'Phase' : 'Leg'} {l.leg} total
					</Text>
					<Text style={big}>{n(l.va.value)} VA</Text>
					<Text style={{ fontSize: 7 }}>{n(l.amps.value, 1)} A</Text>
				</View>
			))}
			<View style={box}>
				<Text style={label}>Imbalance</Text>
				<Text style={big}>{n(panel.imbalance.value, 1)} %</Text>
				<Text style={s.small}>{printable(panel.imbalance.rule)}</Text>
			</View>
			<View style={box}>
				<Text style={label}>Connected load</Text>
				<Text style={big}>{n(panel.connectedVA.value)} VA</Text>
				<Text style={{ fontSize: 7 }}>{n(panel.connectedA.value, 1)} A</Text>
			</View>
			<View style={{ ...box, flexGrow: 2 }}>
				<Text style={label}>Calculated load</Text>
				<Text style={big}>
					{n(panel.calculatedVA.value)} VA · {n(panel.calculatedA.value, 1)} A
				</Text>
				<Text style={s.small}>
					{printable(panel.calculatedVA.rule)}; bus {panel.busRatingA} A
					{panel.mainBreakerA !== null ? `, main ${panel.mainBreakerA} A` : ', main-lug'}
				</Text>
			</View>
		</View>
	);
}

function FindingRow({ block }: { block: FindingBlock }) {
	const color = COLOR[block.finding.severity];
	return (
		<View wrap={false}>
			{block.heading && (
				<Text style={{ ...s.h2, marginTop: 6 }}>Findings for this panel and its circuits</Text>
			)}
			<Text
				style={{
					fontSize: FINDING_SIZE,
					lineHeight: FINDING_LH / FINDING_SIZE,
					marginTop: 3,
					paddingLeft: 10,
					color: block.finding.severity === 'ok' ? COLOR.ink : color,
				}}
			>
				{block.lines.join('\n')}
			</Text>
		</View>
	);
}

/** The schedule's sheets for one panel, paginated here (not by react-pdf) so that sheet counts are known. */
export function panelSchedulePages(data: DocumentData, panelId: string, size: PaperSize): ReactElement[] {
	const panel = data.result.panels.find((p) => p.panelId === panelId);
	if (!panel) throw new Error(`no panel ${panelId} in the job`);
	const blocks = blocksFor(data, panel, size);
	const available = contentHeight(size);
	const pages = packPages(
		blocks,
		(i) => available - (i === 0 ? HEADER_FIRST : HEADER_NEXT) - 6,
		(kind) => (kind === 'row' ? TABLE_HEAD : 0),
	);
	return pages.map((blocksOnPage, i) => (
		<Sheet key={`${panelId}-${i}`} size={size}>
			<Header data={data} panel={panel} first={i === 0} page={i + 1} pages={pages.length} />
			{blocksOnPage.some((b) => b.kind === 'row') && (
				<GridCanvas
					columns={columnsFor(size)}
					rows={[
						headRow(panel.legs.length),
						...blocksOnPage.flatMap((b) => (b.kind === 'row' ? [b.row] : [])),
					]}
				/>
			)}
			{blocksOnPage.map((b, k) =>
				b.kind === 'row' ? null : b.kind === 'summary' ? (
					<Summary key={k} panel={panel} />
				) : (
					<FindingRow key={k} block={b} />
				),
			)}
		</Sheet>
	));
}
