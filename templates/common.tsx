/** Shared page geometry, styles and small pieces of the PDF templates. */
import { Page, StyleSheet, Text, View } from '@react-pdf/renderer';
import type { ReactNode } from 'react';
import { FONT_FAMILY, printable } from '../src/lib/documents/fonts';
import type { PaperSize } from '../src/lib/documents/types';
import type { Finding, VoltageSystem } from '../src/lib/electrical';

/** Landscape sheets, in points. */
export const SHEET: Record<PaperSize, { width: number; height: number }> = {
	letter: { width: 792, height: 612 },
	a4: { width: 842, height: 595 },
};
/** Portrait pages (the directory card prints on one). */
export const PORTRAIT: Record<PaperSize, { width: number; height: number }> = {
	letter: { width: 612, height: 792 },
	a4: { width: 595, height: 842 },
};
export const MARGIN = 30;
/** Space kept free at the foot of every sheet for the stamped "Sheet N of M" line. */
export const FOOTER_SPACE = 24;

/** Height available for content on a landscape sheet. */
export function contentHeight(size: PaperSize): number {
	return SHEET[size].height - 2 * MARGIN - FOOTER_SPACE;
}
export function contentWidth(size: PaperSize): number {
	return SHEET[size].width - 2 * MARGIN;
}

export const COLOR = {
	ink: '#1c232b',
	muted: '#56606b',
	faint: '#8a939c',
	rule: '#b9c0c7',
	shade: '#eef1f4',
	copper: '#9a4a22',
	violation: '#a3161a',
	warning: '#8a5a00',
	note: '#2a5b84',
	ok: '#2f6b3a',
};

export const s = StyleSheet.create({
	page: {
		fontFamily: FONT_FAMILY,
		fontSize: 8,
		color: COLOR.ink,
		paddingTop: MARGIN,
		paddingLeft: MARGIN,
		paddingRight: MARGIN,
		paddingBottom: MARGIN + FOOTER_SPACE,
	},
	kicker: {
		fontSize: 7,
		color: COLOR.copper,
		fontWeight: 700,
		letterSpacing: 0.6,
		textTransform: 'uppercase',
	},
	h1: { fontSize: 16, fontWeight: 700, lineHeight: 1.2 },
	h2: { fontSize: 11, fontWeight: 700, lineHeight: 1.3 },
	small: { fontSize: 6.5, color: COLOR.muted },
	bold: { fontWeight: 700 },
});

/** One landscape sheet with the margins and the free footer band. */
export function Sheet({ size, children }: { size: PaperSize; children: ReactNode }) {
	return (
		<Page size={size === 'letter' ? 'LETTER' : 'A4'} orientation="landscape" style={s.page}>
			{children}
		</Page>
	);
}

/** A label above a value, for header grids. */
export function Field({ label, value, width }: { label: string; value: string; width: number | string }) {
	return (
		<View style={{ width, paddingRight: 6, marginBottom: 4 }}>
			<Text style={{ fontSize: 6, color: COLOR.muted, textTransform: 'uppercase', letterSpacing: 0.4 }}>
				{label}
			</Text>
			<Text style={{ fontSize: 8.5, fontWeight: 700 }}>{printable(value) || '—'}</Text>
		</View>
	);
}

export const VOLTAGE_LABEL: Record<VoltageSystem, string> = {
	'120/240-1ph-3w': '120/240 V single-phase 3-wire',
	'208Y/120-3ph-4w': '208Y/120 V three-phase 4-wire',
};

export const SEVERITY_LABEL: Record<Finding['severity'], string> = {
	violation: 'Violation',
	warning: 'Warning',
	note: 'Note',
	ok: 'Passed',
};

/** Sorts findings worst first (stable). */
export function worstFirst(findings: readonly Finding[]): Finding[] {
	const rank: Record<Finding['severity'], number> = { violation: 0, warning: 1, note: 2, ok: 3 };
	return findings
		.map((f, i) => ({ f, i }))
		.sort((a, b) => rank[a.f.severity] - rank[b.f.severity] || a.i - b.i)
		.map(({ f }) => f);
}

/** Formats a number with thousands separators and at most `decimals` decimals. */
export function n(value: number, decimals = 0): string {
	let f = FORMATS.get(decimals);
	if (!f) {
		f = new Intl.NumberFormat('en-US', { maximumFractionDigits: decimals, minimumFractionDigits: 0 });
		FORMATS.set(decimals, f);
	}
	return f.format(value);
}
const FORMATS = new Map<number, Intl.NumberFormat>();

/** "2026-12-02" as "December 2, 2026". */
export function longDate(iso: string): string {
	const d = new Date(`${iso}T12:00:00Z`);
	return Number.isNaN(d.getTime())
		? iso
		: d.toLocaleDateString('en-US', { year: 'numeric', month: 'long', day: 'numeric', timeZone: 'UTC' });
}

/**
 * Packs blocks of known height onto pages greedily; `extra` is added the first time a block of a
 * kind lands on a page (e.g. a table header repeated on each page that has rows).
 */
export function packPages<T extends { height: number; kind: string }>(
	blocks: readonly T[],
	capacity: (pageIndex: number) => number,
	extra: (kind: string) => number = () => 0,
): T[][] {
	const pages: T[][] = [[]];
	let used = 0;
	let kinds = new Set<string>();
	for (const b of blocks) {
		const head = kinds.has(b.kind) ? 0 : extra(b.kind);
		const page = pages[pages.length - 1]!;
		if (page.length > 0 && used + head + b.height > capacity(pages.length - 1)) {
			pages.push([b]);
			kinds = new Set([b.kind]);
			used = extra(b.kind) + b.height;
			continue;
		}
		page.push(b);
		kinds.add(b.kind);
		used += head + b.height;
	}
	return pages;
}

/** Lines of wrapped text times a line height, plus padding. */
export function textBlockHeight(lines: number, lineHeight: number, padding = 0): number {
	return lines * lineHeight + padding;
}
