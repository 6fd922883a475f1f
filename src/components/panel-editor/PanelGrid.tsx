import { legOf, positionsTaken, rowOf, sideOf } from '../../lib/electrical/positions';
import type { VoltageSystem } from '../../lib/electrical/schema';
import type { Severity } from '../../lib/electrical/types';
import SeverityBadge from '../ui/SeverityBadge';

export interface GridBreaker {
	id: string;
	position: number;
	poles: 1 | 2 | 3;
	ratingA: number;
	label: string;
	breakerType: string;
	severity: Severity;
}

interface Props {
	spaces: number;
	voltageSystem: VoltageSystem;
	breakers: GridBreaker[];
	selected: number | null;
	onSelect: (position: number) => void;
}

const TYPE_SHORT: Record<string, string> = {
	afci: 'AFCI',
	gfci: 'GFCI',
	'dual-function': 'AFCI/GFCI',
	gfpe: 'GFPE',
	standard: '',
};

/**
 * The panelboard as its two columns of positions: odd on the left, even on the right, row by row.
 * A multi-pole breaker spans its rows in its column. Every cell is a button, so Tab reaches it and
 * Enter or Space selects it.
 */
export default function PanelGrid({ spaces, voltageSystem, breakers, selected, onSelect }: Props) {
	const rows = Math.ceil(spaces / 2);
	const covered = new Map<number, GridBreaker>();
	for (const b of breakers) for (const p of positionsTaken(b.position, b.poles)) covered.set(p, b);

	const cells: React.ReactNode[] = [];
	for (let p = 1; p <= rows * 2; p++) {
		const col = sideOf(p) === 'left' ? 2 : 4;
		const row = rowOf(p);
		const b = covered.get(p);
		if (b && b.position !== p) continue; // drawn by its first position
		const span = b ? positionsTaken(b.position, b.poles).filter((q) => q <= rows * 2).length : 1;
		const isSelected =
			selected !== null && (b ? positionsTaken(b.position, b.poles).includes(selected) : selected === p);
		const beyond = p > spaces;
		const base =
			'group flex min-h-[3.25rem] w-full items-center gap-2 rounded-md border px-2 py-1 text-left text-sm focus-visible:outline focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-copper-500';
		const look = beyond
			? 'border-dashed border-ink-100 bg-ink-50 text-ink-300'
			: b
				? isSelected
					? 'border-copper-500 bg-copper-50 ring-2 ring-copper-400'
					: 'border-ink-300 bg-white hover:border-copper-400'
				: isSelected
					? 'border-copper-500 bg-copper-50 ring-2 ring-copper-400 text-ink-700'
					: 'border-dashed border-ink-200 bg-ink-50 text-ink-500 hover:border-copper-400';
		const positions = b ? positionsTaken(b.position, b.poles).join(' & ') : String(p);
		const name = b
			? `Positions ${positions}: ${b.label || 'unlabelled'}, ${b.ratingA} A ${b.poles}-pole${TYPE_SHORT[b.breakerType] ? ' ' + TYPE_SHORT[b.breakerType] : ''}, ${b.severity}`
			: `Position ${p}: space`;
		cells.push(
			<div key={p} style={{ gridColumn: col, gridRow: `${row} / span ${span}` }} className="min-w-0">
				<button
					type="button"
					disabled={beyond}
					aria-pressed={isSelected}
					aria-label={name}
					data-position={p}
					data-circuit-id={b?.id}
					onClick={() => onSelect(p)}
					className={`${base} ${look} ${span > 1 ? 'h-full' : ''}`}
				>
					{b ? (
						<>
							<span className="flex min-w-0 flex-1 flex-col">
								<span className="truncate font-semibold text-ink-900">{b.label || 'Unlabelled'}</span>
								<span className="text-xs text-ink-600">
									{b.ratingA} A · {b.poles}P
									{TYPE_SHORT[b.breakerType] ? ` · ${TYPE_SHORT[b.breakerType]}` : ''}
								</span>
							</span>
							<SeverityBadge severity={b.severity} compact />
						</>
					) : (
						<span className="text-xs uppercase tracking-wide">{beyond ? '' : 'space'}</span>
					)}
				</button>
			</div>,
		);
	}

	const numbers: React.ReactNode[] = [];
	for (let r = 1; r <= rows; r++) {
		const left = 2 * r - 1;
		const right = 2 * r;
		numbers.push(
			<span
				key={`l${r}`}
				style={{ gridColumn: 1, gridRow: r }}
				className="self-center text-right font-mono text-xs text-ink-200"
			>
				{left}
			</span>,
			<span
				key={`leg${r}`}
				style={{ gridColumn: 3, gridRow: r }}
				className="self-center rounded bg-ink-800 px-1 text-center font-mono text-[0.65rem] font-bold text-copper-200"
				title={`Leg ${legOf(left, voltageSystem)}`}
			>
				{legOf(left, voltageSystem)}
			</span>,
			<span
				key={`r${r}`}
				style={{ gridColumn: 5, gridRow: r }}
				className="self-center font-mono text-xs text-ink-200"
			>
				{right}
			</span>,
		);
	}

	return (
		<div className="relative overflow-x-auto rounded-lg bg-ink-900 p-3 shadow-inner" data-testid="panel-grid">
			<div
				className="grid min-w-[20rem] gap-x-1.5 gap-y-1"
				style={{
					gridTemplateColumns: '1.6rem minmax(8rem,1fr) 1.2rem minmax(8rem,1fr) 1.6rem',
					gridTemplateRows: `repeat(${rows}, minmax(3.25rem, auto))`,
				}}
				role="group"
				aria-label="Breaker positions: odd on the left, even on the right"
			>
				{numbers}
				{cells}
			</div>
		</div>
	);
}
