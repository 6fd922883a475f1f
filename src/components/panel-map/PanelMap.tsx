import { useId, useMemo, useState } from 'react';
import { matchSlots, type MapPanel, type MapSlot, type PanelMapData } from '../../lib/documents/panel-map';

const BREAKER_TYPES: Record<string, string> = {
	standard: 'standard breaker',
	afci: 'AFCI breaker',
	gfci: 'GFCI breaker',
	'dual-function': 'AFCI/GFCI breaker',
	gfpe: 'equipment ground-fault breaker',
};

function SlotButton({
	slot,
	hit,
	selected,
	onSelect,
}: {
	slot: MapSlot;
	hit: boolean;
	selected: boolean;
	onSelect: () => void;
}) {
	const base =
		'flex min-h-12 w-full items-start gap-2 rounded-md border px-2 py-1.5 text-left text-sm transition-colors';
	const tone =
		slot.kind === 'space'
			? 'border-dashed border-ink-200 bg-ink-50 text-ink-400'
			: hit
				? 'border-copper-600 bg-copper-100 text-ink-950 ring-2 ring-copper-500'
				: selected
					? 'border-ink-500 bg-ink-100'
					: 'border-ink-200 bg-white text-ink-900';
	return (
		<button
			type="button"
			className={`${base} ${tone}`}
			onClick={onSelect}
			disabled={slot.kind === 'space'}
			aria-pressed={selected}
			data-position={slot.position}
			data-hit={hit ? 'true' : undefined}
		>
			<span className="w-6 shrink-0 text-right font-bold tabular-nums">{slot.position}</span>
			<span className="min-w-0 flex-1 break-words">
				{slot.kind === 'continuation' ? (
					<span className="text-ink-500">with {slot.breaker}</span>
				) : (
					<>
						<span className={`font-semibold ${slot.spare ? 'text-copper-700' : ''}`}>
							{slot.kind === 'space' ? 'Space' : slot.label}
						</span>
						{slot.ratingA !== null && (
							<span className="ml-1 whitespace-nowrap text-xs text-ink-500">{slot.ratingA} A</span>
						)}
					</>
				)}
			</span>
		</button>
	);
}

function Details({ slot, panel }: { slot: MapSlot; panel: MapPanel }) {
	return (
		<div className="panel-card space-y-2" data-testid="breaker-details">
			<h3 className="text-lg font-bold text-ink-950">
				Breaker {slot.breaker}
				{slot.poles && slot.poles > 1 ? `/${(slot.breaker ?? 0) + 2}` : ''} in {panel.name}: {slot.label}
			</h3>
			<p className="text-sm text-ink-700">
				{slot.ratingA} A, {slot.poles}-pole {BREAKER_TYPES[slot.breakerType ?? 'standard'] ?? 'breaker'}
				{slot.feedsPanel ? `; feeds the ${slot.feedsPanel} panel` : ''}
			</p>
			<div>
				<h4 className="text-sm font-semibold text-ink-800">Rooms</h4>
				<p className="text-sm text-ink-700">
					{slot.rooms.length ? slot.rooms.join(', ') : 'No rooms recorded'}
				</p>
			</div>
			<div>
				<h4 className="text-sm font-semibold text-ink-800">What it feeds</h4>
				{slot.loads.length ? (
					<ul className="list-disc pl-5 text-sm text-ink-700">
						{slot.loads.map((l, i) => (
							<li key={i}>
								{l.quantity > 1 ? `${l.quantity} × ` : ''}
								{l.description}
								{l.va ? ` (${l.va.toLocaleString('en-US')} VA${l.quantity > 1 ? ' each' : ''})` : ''}
							</li>
						))}
					</ul>
				) : (
					<p className="text-sm text-ink-700">Nothing recorded</p>
				)}
			</div>
		</div>
	);
}

/** The home's panels as their positions (odd left, even right), with a search that highlights breakers. */
export default function PanelMap({ data }: { data: PanelMapData }) {
	const [query, setQuery] = useState('');
	const [selected, setSelected] = useState<{ panel: string; position: number } | null>(null);
	const searchId = useId();
	const hits = useMemo(
		() => new Map(data.panels.map((p) => [p.id, matchSlots(p, query)])),
		[data.panels, query],
	);
	const total = [...hits.values()].reduce((n, s) => n + s.size, 0);
	const firstHit = data.panels
		.flatMap((p) =>
			[...(hits.get(p.id) ?? [])].map((pos) => ({
				panel: p,
				slot: p.slots.find((s) => s.position === pos)!,
			})),
		)
		.find((h) => h.slot.kind === 'circuit');
	const shown = selected
		? (() => {
				const panel = data.panels.find((p) => p.id === selected.panel);
				const slot = panel?.slots.find((s) => s.position === selected.position);
				const main =
					slot && slot.kind === 'continuation' ? panel?.slots.find((s) => s.position === slot.breaker) : slot;
				return panel && main ? { panel, slot: main } : null;
			})()
		: (firstHit ?? null);

	return (
		<div className="space-y-4">
			<div>
				<label htmlFor={searchId} className="field-label">
					Find a breaker
				</label>
				<input
					id={searchId}
					type="search"
					className="field-input"
					placeholder="garage, dishwasher, breaker 14"
					value={query}
					onChange={(e) => {
						setQuery(e.target.value);
						setSelected(null);
					}}
					autoComplete="off"
				/>
				<p className="mt-1 text-sm text-ink-600" role="status" aria-live="polite">
					{query.trim()
						? total
							? `${total} position${total === 1 ? ' matches' : 's match'} “${query.trim()}”.`
							: `Nothing matches “${query.trim()}”.`
						: 'Type a room, an appliance or a breaker number.'}
				</p>
			</div>
			{shown && <Details slot={shown.slot} panel={shown.panel} />}
			{data.panels.map((panel) => (
				<section key={panel.id} className="panel-card p-3" aria-label={`Panel ${panel.name}`}>
					<h2 className="text-lg font-bold text-ink-950">{panel.name}</h2>
					<p className="mb-2 text-sm text-ink-600">
						{panel.location || 'Location not recorded'} ·{' '}
						{panel.mainBreakerA ? `main ${panel.mainBreakerA} A` : 'main-lug'}
					</p>
					<div className="grid grid-cols-2 gap-1.5">
						{panel.slots.map((slot) => (
							<SlotButton
								key={slot.position}
								slot={slot}
								hit={hits.get(panel.id)?.has(slot.position) ?? false}
								selected={selected?.panel === panel.id && selected.position === slot.position}
								onSelect={() => setSelected({ panel: panel.id, position: slot.position })}
							/>
						))}
					</div>
				</section>
			))}
		</div>
	);
}
