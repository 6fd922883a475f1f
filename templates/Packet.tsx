/** Permit packet sheets: cover with sheet index, load calculation, findings, lighting layouts, cautions and signature. */
import { Circle, Line, Rect, Svg, Text, View } from '@react-pdf/renderer';
import type { ReactElement } from 'react';
import type { DocumentData, LightingLayoutSource, PaperSize } from '../src/lib/documents/types';
import type { Figure, Line as WorksheetLine, MethodResult } from '../src/lib/electrical';
import { printable } from '../src/lib/documents/fonts';
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
	worstFirst,
} from './common';
import { cellHeight, cellLines, GridCanvas, type GridCell, type GridRow } from './grid';
import { panelSchedulePages } from './PanelSchedule';

const BODY = 7.5;
const BODY_LH = 9.6;
const TITLE_H = 34;

function SheetTitle({
	kicker,
	title,
	data,
	right,
}: {
	kicker: string;
	title: string;
	data: DocumentData;
	right?: string;
}) {
	return (
		<View
			style={{
				height: TITLE_H - 4,
				marginBottom: 4,
				flexDirection: 'row',
				justifyContent: 'space-between',
				borderBottom: `1pt solid ${COLOR.ink}`,
			}}
		>
			<View>
				<Text style={s.kicker}>{kicker}</Text>
				<Text style={{ fontSize: 13, fontWeight: 700 }}>{printable(title)}</Text>
			</View>
			<View style={{ alignItems: 'flex-end', maxWidth: 360 }}>
				<Text style={{ fontSize: 8, fontWeight: 700 }}>{printable(data.job.name)}</Text>
				<Text style={{ fontSize: 7, color: COLOR.muted }}>{printable(right ?? data.job.address)}</Text>
			</View>
		</View>
	);
}

const text = (t: string, w: number, opts: { bold?: boolean; color?: string; size?: number } = {}) =>
	cellLines(t, w, opts.size ?? BODY, (opts.size ?? BODY) * 1.28, opts);

function row(cells: GridCell[], extra: Partial<GridRow> = {}): GridRow {
	return { height: Math.max(BODY_LH + 5, ...cells.map((c) => cellHeight(c.lines))), cells, ...extra };
}

function headRow(labels: string[], aligns: GridCell['align'][] = []): GridRow {
	return {
		height: 15,
		fill: COLOR.ink,
		border: 'none',
		cells: labels.map((l, i) => ({
			lines: [{ text: l, size: 6.5, bold: true, color: '#ffffff', lineHeight: 10 }],
			align: aligns[i],
		})),
	};
}

interface TableBlock {
	kind: string;
	height: number;
	row: GridRow;
}

/** Table rows packed onto sheets, the head row repeated on each; each sheet gets a title. */
function tableSheets(
	data: DocumentData,
	size: PaperSize,
	kicker: string,
	title: string,
	columns: number[],
	head: GridRow,
	blocks: TableBlock[],
	keyPrefix: string,
): ReactElement[] {
	const cap = contentHeight(size) - TITLE_H - 4;
	const pages = packPages(
		blocks,
		() => cap,
		() => head.height,
	);
	return pages.map((rows, i) => (
		<Sheet key={`${keyPrefix}-${i}`} size={size}>
			<SheetTitle
				kicker={kicker}
				title={pages.length > 1 ? `${title} (${i + 1} of ${pages.length})` : title}
				data={data}
			/>
			<GridCanvas columns={columns} rows={[head, ...rows.map((r) => r.row)]} />
		</Sheet>
	));
}

// ---------------------------------------------------------------- load calculation

function worksheetColumns(size: PaperSize): number[] {
	const w = contentWidth(size);
	return [22, 168, w - 22 - 168 - 150 - 78, 150, 78];
}

function lineRow(
	cols: number[],
	no: string,
	label: string,
	f: Figure,
	opts: { bold?: boolean; fill?: string } = {},
): GridRow {
	return row(
		[
			{ lines: text(no, cols[0]!, { color: COLOR.muted }) },
			{ lines: text(label, cols[1]!, { bold: opts.bold }) },
			{ lines: text(f.working, cols[2]!) },
			{ lines: text(f.rule, cols[3]!, { color: COLOR.muted, size: 6.5 }) },
			{
				lines: text(
					`${n(f.value, 2)} ${f.unit === 'ft2' ? 'ft²' : f.unit === 'count' ? '' : f.unit}`,
					cols[4]!,
					{ bold: true },
				),
				align: 'right',
			},
		],
		opts.fill ? { fill: opts.fill } : {},
	);
}

function bannerRow(cols: number[], title: string, sub: string): GridRow {
	const w = cols.reduce((a, b) => a + b, 0);
	const lines = [...text(title, w, { bold: true, size: 9 }), ...text(sub, w, { color: COLOR.muted })];
	return {
		height: cellHeight(lines) + 4,
		fill: '#f3e6dd',
		border: 'strong',
		cells: [{ lines }, { lines: [] }, { lines: [] }, { lines: [] }, { lines: [] }],
	};
}

/** Rows of one method of the dwelling load calculation, every step with its code reference. */
function methodRows(cols: number[], m: MethodResult, serviceA: number): GridRow[] {
	const rows: GridRow[] = [
		bannerRow(cols, `${m.title} (${m.rule})`, m.applicable ? m.reason : `Not applicable: ${m.reason}`),
	];
	if (!m.applicable) return rows;
	m.lines.forEach((l: WorksheetLine, i) => rows.push(lineRow(cols, String(i + 1), l.label, l)));
	const results: [string, Figure | null][] = [
		['Calculated load', m.totalVA],
		['Current', m.amps],
		['Current, rounded', m.ampsRounded],
		['Minimum service rating', m.minimumServiceA],
		[`Headroom on the ${serviceA} A service`, m.headroomA],
	];
	for (const [label, f] of results)
		if (f) rows.push(lineRow(cols, '=', label, f, { bold: true, fill: COLOR.shade }));
	return rows;
}

function loadCalcSheets(data: DocumentData, size: PaperSize): ReactElement[] {
	const cols = worksheetColumns(size);
	const sv = data.result.service;
	const rows: GridRow[] = [];
	rows.push(
		bannerRow(cols, `Service: ${sv.ratingA} A, ${sv.voltageSystem}`, 'Floor area for general lighting'),
	);
	rows.push(lineRow(cols, '', 'Floor area', sv.floorArea));
	for (const m of sv.methods) rows.push(...methodRows(cols, m, sv.ratingA));
	rows.push(bannerRow(cols, 'Neutral load (NEC 220.61)', 'Feeder or service neutral'));
	sv.neutral.lines.forEach((l, i) => rows.push(lineRow(cols, String(i + 1), l.label, l)));
	rows.push(lineRow(cols, '=', 'Neutral load', sv.neutral.totalVA, { bold: true, fill: COLOR.shade }));
	rows.push(lineRow(cols, '=', 'Neutral current', sv.neutral.amps, { bold: true, fill: COLOR.shade }));
	rows.push(
		lineRow(cols, '=', 'Neutral current, rounded', sv.neutral.ampsRounded, { bold: true, fill: COLOR.shade }),
	);
	const lowest = sv.methods.find((m) => m.method === sv.lowestMethod);
	rows.push(
		bannerRow(
			cols,
			'Result',
			lowest ? `Lowest applicable method: ${lowest.title}` : 'No method applies: complete the job record',
		),
	);
	rows.push(
		lineRow(cols, '=', 'Minimum service rating', sv.minimumServiceA, { bold: true, fill: COLOR.shade }),
	);
	for (const f of worstFirst(sv.findings))
		rows.push(
			row([
				{
					lines: text(SEVERITY_LABEL[f.severity].slice(0, 4), cols[0]!, {
						size: 6,
						color: COLOR[f.severity],
					}),
				},
				{ lines: text(SEVERITY_LABEL[f.severity], cols[1]!, { bold: true, color: COLOR[f.severity] }) },
				{ lines: text(f.message, cols[2]!) },
				{ lines: text(f.rule, cols[3]!, { color: COLOR.muted, size: 6.5 }) },
				{ lines: [] },
			]),
		);
	return tableSheets(
		data,
		size,
		'Load calculation worksheet',
		`Dwelling service load, NEC ${data.doc.codeEdition} Article 220`,
		cols,
		headRow(
			['#', 'Item', 'Working', 'Code reference', 'Value'],
			[undefined, undefined, undefined, undefined, 'right'],
		),
		rows.map((r) => ({ kind: 'row', height: r.height, row: r })),
		'calc',
	);
}

// ---------------------------------------------------------------- findings

function findingsSheets(data: DocumentData, size: PaperSize): ReactElement[] {
	const w = contentWidth(size);
	const cols = [70, 150, 78, 70, 58, 58, 44, w - 70 - 150 - 78 - 70 - 58 - 58 - 44];
	const panels = new Map(data.doc.panels.map((p) => [p.id, p.name]));
	const circuits = new Map(data.doc.circuits.map((c) => [c.id, c]));
	const rows: GridRow[] = [];
	for (const r of data.result.circuits) {
		const c = circuits.get(r.circuitId);
		if (!c) continue;
		const bad = worstFirst(r.findings.filter((f) => f.severity !== 'ok'));
		const passed = r.findings.length - bad.length;
		const findingLines = bad.length
			? bad.flatMap((f) =>
					text(`${SEVERITY_LABEL[f.severity]}: ${f.message} [${f.rule}]`, cols[7]!, {
						color: COLOR[f.severity],
					}),
				)
			: text(`All ${passed} checks passed`, cols[7]!, { color: COLOR.ok });
		rows.push(
			row([
				{ lines: text(`${panels.get(r.panelId) ?? ''} ${r.positions.join('/')}`, cols[0]!, { bold: true }) },
				{ lines: text(r.label || '(no label)', cols[1]!) },
				{
					lines: text(
						`${c.ratingA} A ${c.poles}P · ${c.conductor.size} ${c.conductor.material === 'cu' ? 'Cu' : 'Al'}`,
						cols[2]!,
					),
				},
				{ lines: text(`${n(r.connectedVA.value)} VA`, cols[3]!), align: 'right' },
				{ lines: text(`${n(r.breakerLoadA.value, 1)} A`, cols[4]!), align: 'right' },
				{
					lines: text(r.conductorAmpacityA ? `${n(r.conductorAmpacityA.value)} A` : '—', cols[5]!),
					align: 'right',
				},
				{ lines: text(`${n(r.voltageDrop.percent.value, 2)} %`, cols[6]!), align: 'right' },
				{ lines: findingLines },
			]),
		);
	}
	const jobLevel = worstFirst(
		[
			...data.result.protection,
			...data.result.service.findings,
			...data.result.panels.flatMap((p) => p.findings),
		].filter((f) => f.severity !== 'ok'),
	);
	const wide = cols.slice(1, 7).reduce((a, b) => a + b, 0);
	for (const [i, f] of jobLevel.entries()) {
		rows.push(
			row([
				{ lines: text(i === 0 ? 'Job, panels, service' : '', cols[0]!, { bold: true }) },
				{ lines: text(f.message, wide) },
				{ lines: [] },
				{ lines: [] },
				{ lines: [] },
				{ lines: [] },
				{ lines: [] },
				{ lines: text(`${SEVERITY_LABEL[f.severity]} [${f.rule}]`, cols[7]!, { color: COLOR[f.severity] }) },
			]),
		);
	}
	const sum = data.result.summary;
	return tableSheets(
		data,
		size,
		'Circuit findings',
		`Checks of every circuit: ${sum.violation} violation(s), ${sum.warning} warning(s), ${sum.note} note(s), ${sum.ok} passed`,
		cols,
		headRow(
			['Panel · ckt', 'Label', 'Breaker · wire', 'Load', 'Breaker load', 'Ampacity', 'V drop', 'Findings'],
			[undefined, undefined, undefined, 'right', 'right', 'right', 'right'],
		),
		rows.map((r) => ({ kind: 'row', height: r.height, row: r })),
		'findings',
	);
}

/** The contractor's note on each error-level finding left in the submission, for the reviewer to weigh. */
function explainedSheets(data: DocumentData, size: PaperSize): ReactElement[] {
	const w = contentWidth(size);
	const cols = [Math.round(w * 0.42), w - Math.round(w * 0.42)];
	const rows = (data.explanations ?? []).map((e) =>
		row([
			{
				lines: [
					...text(`${SEVERITY_LABEL.violation}: ${e.message}`, cols[0]!, { color: COLOR.violation }),
					...text(`[${e.rule}] · ${e.code}`, cols[0]!, { color: COLOR.muted, size: 6.5 }),
				],
			},
			{ lines: text(e.note, cols[1]!) },
		]),
	);
	return tableSheets(
		data,
		size,
		'Findings explained by the contractor',
		`${rows.length} violation(s) left in this submission, each with the contractor’s note`,
		cols,
		headRow(['Finding', 'Contractor’s explanation']),
		rows.map((r) => ({ kind: 'row', height: r.height, row: r })),
		'explained',
	);
}

// ---------------------------------------------------------------- lighting layouts

const SCALES: [number, string][] = [
	[0.5, '1/2 in = 1 ft'],
	[0.375, '3/8 in = 1 ft'],
	[0.25, '1/4 in = 1 ft'],
	[0.1875, '3/16 in = 1 ft'],
	[0.125, '1/8 in = 1 ft'],
	[0.09375, '3/32 in = 1 ft'],
	[0.0625, '1/16 in = 1 ft'],
];

/** The largest architectural scale at which a room fits a box (points per foot and its name). */
export function layoutScale(
	lengthFt: number,
	widthFt: number,
	boxW: number,
	boxH: number,
): { ptPerFt: number; name: string } {
	for (const [inches, name] of SCALES) {
		const pt = inches * 72;
		if (lengthFt * pt <= boxW && widthFt * pt <= boxH) return { ptPerFt: pt, name };
	}
	const pt = Math.min(boxW / lengthFt, boxH / widthFt);
	return { ptPerFt: pt, name: `1 in = ${n(72 / pt, 1)} ft` };
}

function layoutSheet(
	data: DocumentData,
	size: PaperSize,
	l: LightingLayoutSource,
	key: string,
): ReactElement {
	const boxW = contentWidth(size) - 200;
	const boxH = contentHeight(size) - TITLE_H - 40;
	const lengthFt = l.input.lengthFt;
	const widthFt = l.input.widthFt;
	const { ptPerFt, name } = layoutScale(lengthFt, widthFt, boxW - 20, boxH - 20);
	const W = lengthFt * ptPerFt;
	const H = widthFt * ptPerFt;
	const ox = 10;
	const oy = 10;
	const lay = l.layout;
	const r = Math.max(2, ((l.input.fixtureDiameterIn / 12) * ptPerFt) / 2);
	const joistAlongLength = l.input.joists?.direction === 'along-length';
	return (
		<Sheet key={key} size={size}>
			<SheetTitle
				kicker="Lighting layout, drawn to scale"
				title={`${l.title} — ${l.roomName}`}
				data={data}
				right={`Scale ${name} (printed at 100 %)`}
			/>
			<View style={{ flexDirection: 'row' }}>
				<Svg width={boxW} height={boxH}>
					<Rect x={ox} y={oy} width={W} height={H} stroke={COLOR.ink} strokeWidth={1.5} fill="#ffffff" />
					{lay.joistLinesFt.map((j, i) =>
						joistAlongLength ? (
							<Line
								key={`j${i}`}
								x1={ox}
								y1={oy + j * ptPerFt}
								x2={ox + W}
								y2={oy + j * ptPerFt}
								stroke={COLOR.rule}
								strokeWidth={0.6}
								strokeDasharray="3,2"
							/>
						) : (
							<Line
								key={`j${i}`}
								x1={ox + j * ptPerFt}
								y1={oy}
								x2={ox + j * ptPerFt}
								y2={oy + H}
								stroke={COLOR.rule}
								strokeWidth={0.6}
								strokeDasharray="3,2"
							/>
						),
					)}
					{lay.fixtures.map((f) => (
						<Circle
							key={f.id}
							cx={ox + f.x * ptPerFt}
							cy={oy + f.y * ptPerFt}
							r={r}
							stroke={COLOR.copper}
							strokeWidth={1}
							fill="#f3e6dd"
						/>
					))}
					<Line
						x1={ox}
						y1={oy + H + 14}
						x2={ox + 5 * ptPerFt}
						y2={oy + H + 14}
						stroke={COLOR.ink}
						strokeWidth={2}
					/>
				</Svg>
				<View style={{ width: 190, paddingLeft: 8 }}>
					<Field
						width="100%"
						label="Room"
						value={`${n(lengthFt, 2)} ft × ${n(widthFt, 2)} ft, ceiling ${n(l.input.ceilingHeightFt, 2)} ft`}
					/>
					<Field
						width="100%"
						label="Fixtures"
						value={`${lay.count} (${lay.rows} rows × ${lay.columns} columns), ${n(l.input.fixtureDiameterIn, 1)} in`}
					/>
					<Field
						width="100%"
						label="Spacing"
						value={`${n(lay.spacingX.value, 2)} ft along, ${n(lay.spacingY.value, 2)} ft across`}
					/>
					<Field
						width="100%"
						label="From the walls"
						value={`${n(lay.wallOffsetX.value, 2)} ft and ${n(lay.wallOffsetY.value, 2)} ft`}
					/>
					{lay.joistClearance && (
						<Field
							width="100%"
							label="Joist clearance"
							value={`${n(lay.joistClearance.value, 2)} ${lay.joistClearance.unit}`}
						/>
					)}
					<Field width="100%" label="Scale" value={`${name}; the bar under the plan is 5 ft`} />
					{lay.notes.map((note, i) => (
						<Text key={i} style={{ fontSize: 7, color: COLOR.muted, marginTop: 2 }}>
							{printable(note)}
						</Text>
					))}
					<Text style={{ fontSize: 7, color: COLOR.muted, marginTop: 4 }}>
						Dashed lines: ceiling joists. Circles: fixture holes at their diameter. Origin: the top-left
						corner.
					</Text>
				</View>
			</View>
		</Sheet>
	);
}

// ---------------------------------------------------------------- cover, index, cautions

export interface IndexEntry {
	title: string;
	first: number;
	count: number;
}

const INDEX_ROW = 13;

function coverSheets(data: DocumentData, size: PaperSize, indexPages: IndexEntry[][]): ReactElement[] {
	const facts: [string, string][] = [
		['Property', data.job.address],
		['Homeowner', [data.job.homeownerName, data.job.homeownerEmail].filter(Boolean).join(' · ')],
		['Contractor', `${data.firm.name}, licence ${data.firm.licenceNumber}`],
		['Contractor address', [data.firm.address, data.firm.phone].filter(Boolean).join(' · ')],
		[
			'Jurisdiction (AHJ)',
			data.jurisdiction
				? `${data.jurisdiction.name}${data.jurisdiction.address ? `, ${data.jurisdiction.address}` : ''}`
				: 'not recorded',
		],
		['Permit type', data.job.permitType],
		['Permit number', data.job.permitNumber || 'not yet issued'],
		['Code edition', `NEC ${data.doc.codeEdition} (NFPA 70), as adopted and amended by the AHJ`],
		['Service', `${data.doc.service.ratingA} A, ${data.doc.service.voltageSystem}`],
		['Date · revision', `${longDate(data.date)} · ${revisionText(data.revision, data.draft)}`],
	];
	const indexBlock = (entries: IndexEntry[]) => (
		<View style={{ border: `1pt solid ${COLOR.ink}` }}>
			<View
				style={{ flexDirection: 'row', backgroundColor: COLOR.ink, paddingHorizontal: 4, paddingVertical: 2 }}
			>
				<Text style={{ width: 60, color: '#ffffff', fontSize: 6.5, fontWeight: 700 }}>Sheet</Text>
				<Text style={{ color: '#ffffff', fontSize: 6.5, fontWeight: 700 }}>Contents</Text>
			</View>
			{entries.map((e, i) => (
				<View
					key={i}
					style={{
						flexDirection: 'row',
						height: INDEX_ROW,
						paddingHorizontal: 4,
						borderTop: i ? `0.5pt solid ${COLOR.rule}` : undefined,
					}}
				>
					<Text style={{ width: 60, fontSize: 7.5, fontWeight: 700 }}>
						{e.count > 1 ? `${e.first}–${e.first + e.count - 1}` : e.first}
					</Text>
					<Text style={{ flex: 1, fontSize: 7.5 }}>
						{printable(e.title.length > 70 ? `${e.title.slice(0, 69)}…` : e.title)}
					</Text>
				</View>
			))}
		</View>
	);
	const sum = data.result.summary;
	const sv = data.result.service;
	const lowest = sv.methods.find((m) => m.method === sv.lowestMethod);
	const scopeLines = cellLines(data.job.scopeOfWork || 'Not stated', 330, 8.5, 11).map((l) => l.text);
	const out: ReactElement[] = [
		<Sheet key="cover" size={size}>
			<View style={{ flexDirection: 'row', height: contentHeight(size) }}>
				<View style={{ width: contentWidth(size) * 0.5, paddingRight: 16 }}>
					<Text style={s.kicker}>Electrical permit packet</Text>
					<Text style={{ fontSize: 18, fontWeight: 700, lineHeight: 1.2, marginBottom: 8 }}>
						{printable(data.job.name)}
					</Text>
					{facts.map(([k, v]) => (
						<Field key={k} width="100%" label={k} value={v} />
					))}
					<Text style={{ fontSize: 6, color: COLOR.muted, textTransform: 'uppercase', marginTop: 2 }}>
						Scope of work
					</Text>
					<Text style={{ fontSize: 8.5, lineHeight: 11 / 8.5 }}>{scopeLines.slice(0, 8).join('\n')}</Text>
				</View>
				<View style={{ flex: 1 }}>
					<Text style={{ ...s.h2, marginBottom: 4 }}>Sheet index</Text>
					{indexBlock(indexPages[0] ?? [])}
					{indexPages.length > 1 && (
						<Text style={{ fontSize: 7, color: COLOR.muted, marginTop: 2 }}>
							Continued on the next sheet.
						</Text>
					)}
					<View style={{ marginTop: 10, border: `1pt solid ${COLOR.rule}`, padding: 6 }}>
						<Text style={{ ...s.h2, fontSize: 9 }}>Summary of the checks</Text>
						<Text style={{ fontSize: 8 }}>
							Service load ({lowest?.title ?? 'no method applies'}):{' '}
							{lowest?.totalVA ? `${n(lowest.totalVA.value)} VA` : '—'}
							{lowest?.ampsRounded ? `, ${n(lowest.ampsRounded.value)} A on a ${sv.ratingA} A service` : ''}
						</Text>
						<Text style={{ fontSize: 8 }}>
							Findings: {sum.violation} violation(s), {sum.warning} warning(s), {sum.note} note(s); {sum.ok}{' '}
							checks passed.
						</Text>
					</View>
				</View>
			</View>
		</Sheet>,
	];
	for (let i = 1; i < indexPages.length; i++) {
		out.push(
			<Sheet key={`index-${i}`} size={size}>
				<SheetTitle kicker="Sheet index" title="Sheet index (continued)" data={data} />
				{indexBlock(indexPages[i]!)}
			</Sheet>,
		);
	}
	return out;
}

const CAUTIONS = [
	'Switch the breaker off and verify with a tester that every conductor is de-energised before any work. The panelboard’s line terminals stay live with the main breaker off.',
	'Work inside a panelboard, on feeders or on the service is for licensed electricians; the service conductors and meter are the utility’s.',
	'Follow the code as adopted and amended by the authority having jurisdiction (AHJ), the equipment’s listing and instructions, and licensed practice; where they differ from this packet, they govern.',
];
const LIMITS = [
	'This packet was prepared with Ampledger from the records the contractor entered. Its figures are the arithmetic of the code sections named beside them, applied to those records; they are as good as the records.',
	'It helps prepare and check documents. It does not certify a design, replace plan review or inspection, or take the place of the electrician’s judgement on site. Field conditions, existing wiring and local amendments are not known to it unless recorded.',
	'Conductor ampacities assume the conditions stated on each circuit (terminal temperature, insulation); corrections for ambient temperature, bundling and conduit fill are the installer’s to apply.',
];

function cautionsSheet(data: DocumentData, size: PaperSize): ReactElement {
	const para = { fontSize: 8.5, lineHeight: 1.35, marginBottom: 4 };
	const sigBox = { flex: 1, borderBottom: `1pt solid ${COLOR.ink}`, height: 34, marginRight: 14 };
	const label = { fontSize: 7, color: COLOR.muted, marginTop: 2, marginRight: 14, flex: 1 };
	return (
		<Sheet key="cautions" size={size}>
			<SheetTitle
				kicker="Cautions, limits and signature"
				title="Before work, and what this packet claims"
				data={data}
			/>
			<Text style={s.h2}>Cautions</Text>
			{CAUTIONS.map((c, i) => (
				<Text
					key={i}
					style={{ ...para, color: i === 0 ? COLOR.violation : COLOR.ink, fontWeight: i === 0 ? 700 : 400 }}
				>
					{c}
				</Text>
			))}
			<Text style={{ ...s.h2, marginTop: 6 }}>Limits of this document</Text>
			{LIMITS.map((c, i) => (
				<Text key={i} style={para}>
					{c}
				</Text>
			))}
			<Text style={{ ...s.h2, marginTop: 10 }}>Contractor’s statement and signature</Text>
			<Text style={para}>
				I prepared this packet for the work described on sheet 1 and will install it in accordance with NEC{' '}
				{data.doc.codeEdition} as adopted by {data.jurisdiction?.name ?? 'the authority having jurisdiction'}.
			</Text>
			<View style={{ flexDirection: 'row', marginTop: 14 }}>
				<View style={sigBox} />
				<View style={sigBox} />
				<View style={{ ...sigBox, marginRight: 0 }} />
			</View>
			<View style={{ flexDirection: 'row' }}>
				<Text style={label}>Signature of the licensed electrician</Text>
				<Text style={label}>
					Name and licence number ({data.firm.name}, {data.firm.licenceNumber})
				</Text>
				<Text style={{ ...label, marginRight: 0 }}>Date</Text>
			</View>
			<View style={{ flexDirection: 'row', marginTop: 18 }}>
				<View style={sigBox} />
				<View style={{ ...sigBox, marginRight: 0 }} />
			</View>
			<View style={{ flexDirection: 'row' }}>
				<Text style={label}>For the AHJ: plan reviewer</Text>
				<Text style={{ ...label, marginRight: 0 }}>Date and stamp</Text>
			</View>
		</Sheet>
	);
}

/** What goes between the generated sheets: the sketches, whose page counts the caller knows. */
export interface SketchSection {
	title: string;
	pages: number;
}

export interface PacketPlan {
	/** Generated sheets before the sketches. */
	before: ReactElement[];
	/** Generated sheets after the sketches. */
	after: ReactElement[];
	index: IndexEntry[];
}

/**
 * Lays out the packet: every section paginated first, then the sheet index numbered from the
 * page counts, then the cover. Sketch pages are placed by the caller between `before` and `after`.
 */
export function packetPlan(data: DocumentData, size: PaperSize, sketches: SketchSection[]): PacketPlan {
	const sections: { title: string; sheets: ReactElement[] }[] = [];
	sections.push({ title: 'Load calculation worksheet', sheets: loadCalcSheets(data, size) });
	for (const p of data.result.panels) {
		sections.push({ title: `Panel schedule: ${p.name}`, sheets: panelSchedulePages(data, p.panelId, size) });
	}
	sections.push({ title: 'Circuit findings', sheets: findingsSheets(data, size) });
	if (data.explanations?.length) {
		sections.push({ title: 'Findings explained by the contractor', sheets: explainedSheets(data, size) });
	}
	data.layouts.forEach((l, i) =>
		sections.push({
			title: `Lighting layout: ${l.title} (${l.roomName})`,
			sheets: [layoutSheet(data, size, l, `layout-${i}`)],
		}),
	);
	const after = { title: 'Cautions, limits and signature', sheets: [cautionsSheet(data, size)] };

	const entryTitles: { title: string; count: number }[] = [
		...sections.map((x) => ({ title: x.title, count: x.sheets.length })),
		...sketches.map((x) => ({ title: x.title, count: x.pages })),
		{ title: after.title, count: 1 },
	];
	const coverEntries = 1 + entryTitles.length;
	const firstCap = Math.floor((contentHeight(size) - 120) / INDEX_ROW);
	const nextCap = Math.floor((contentHeight(size) - TITLE_H - 20) / INDEX_ROW);
	const indexSheets = coverEntries <= firstCap ? 1 : 1 + Math.ceil((coverEntries - firstCap) / nextCap);
	const index: IndexEntry[] = [{ title: 'Cover sheet and sheet index', first: 1, count: indexSheets }];
	let next = 1 + indexSheets;
	for (const e of entryTitles) {
		index.push({ title: e.title, first: next, count: e.count });
		next += e.count;
	}
	const indexPages: IndexEntry[][] = [index.slice(0, firstCap)];
	for (let i = firstCap; i < index.length; i += nextCap) indexPages.push(index.slice(i, i + nextCap));
	return {
		before: [...coverSheets(data, size, indexPages), ...sections.flatMap((x) => x.sheets)],
		after: after.sheets,
		index,
	};
}
