import type { RecessedLayout } from '../../lib/electrical';
import { num } from '../../lib/electrical/format';

interface Props {
	lengthFt: number;
	widthFt: number;
	layout: RecessedLayout;
	fixtureDiameterIn: number;
	joistsAlong: 'none' | 'along-length' | 'along-width';
}

/** The room to scale (x along the length, y along the width, feet): joists as dashed lines, fixtures as circles; moved ones marked. */
export default function LayoutDrawing({ lengthFt, widthFt, layout, fixtureDiameterIn, joistsAlong }: Props) {
	const pad = Math.max(lengthFt, widthFt) * 0.08;
	const r = Math.max(fixtureDiameterIn / 24, 0.12);
	const stroke = Math.max(lengthFt, widthFt) / 300;
	return (
		<figure className="mt-2">
			<svg
				viewBox={`${-pad} ${-pad} ${lengthFt + 2 * pad} ${widthFt + 2 * pad}`}
				className="h-auto max-h-[28rem] w-full rounded-md bg-ink-50"
				role="img"
				aria-label={`Room ${num(lengthFt)} by ${num(widthFt)} ft with ${layout.count} recessed lights`}
				data-testid="layout-svg"
			>
				<rect
					x={0}
					y={0}
					width={lengthFt}
					height={widthFt}
					fill="#fff"
					stroke="#182335"
					strokeWidth={stroke * 3}
				/>
				{joistsAlong !== 'none' &&
					layout.joistLinesFt.map((j) =>
						joistsAlong === 'along-width' ? (
							<line
								key={j}
								x1={j}
								y1={0}
								x2={j}
								y2={widthFt}
								stroke="#9aaec4"
								strokeWidth={stroke * 2}
								strokeDasharray={`${stroke * 6} ${stroke * 4}`}
							/>
						) : (
							<line
								key={j}
								x1={0}
								y1={j}
								x2={lengthFt}
								y2={j}
								stroke="#9aaec4"
								strokeWidth={stroke * 2}
								strokeDasharray={`${stroke * 6} ${stroke * 4}`}
							/>
						),
					)}
				{layout.fixtures.map((f) => {
					const moved = f.movedIn > 0.001;
					return (
						<g key={f.id} data-moved={moved || undefined}>
							{moved && (
								<>
									<circle
										cx={f.idealX}
										cy={f.idealY}
										r={r}
										fill="none"
										stroke="#b7791f"
										strokeWidth={stroke}
										strokeDasharray={`${stroke * 2} ${stroke * 2}`}
									/>
									<line x1={f.idealX} y1={f.idealY} x2={f.x} y2={f.y} stroke="#b7791f" strokeWidth={stroke} />
								</>
							)}
							<circle
								cx={f.x}
								cy={f.y}
								r={r}
								fill={moved ? '#eaa86f' : '#d06a22'}
								stroke="#73341a"
								strokeWidth={stroke}
							>
								<title>
									Row {f.row}, column {f.column}: {num(f.x)} ft, {num(f.y)} ft
									{moved ? ` (moved ${num(f.movedIn)} in to clear a joist)` : ''}
								</title>
							</circle>
						</g>
					);
				})}
				<text x={lengthFt / 2} y={-pad * 0.3} textAnchor="middle" fontSize={pad * 0.45} fill="#3a5270">
					{num(lengthFt)} ft
				</text>
				<text
					x={-pad * 0.3}
					y={widthFt / 2}
					textAnchor="middle"
					fontSize={pad * 0.45}
					fill="#3a5270"
					transform={`rotate(-90 ${-pad * 0.3} ${widthFt / 2})`}
				>
					{num(widthFt)} ft
				</text>
			</svg>
			<figcaption className="mt-1 flex flex-wrap gap-x-4 text-xs text-ink-600">
				<span>
					<span className="mr-1 inline-block h-2.5 w-2.5 rounded-full bg-copper-500 align-middle" /> fixture
				</span>
				<span>
					<span className="mr-1 inline-block h-2.5 w-2.5 rounded-full bg-copper-300 align-middle" /> moved to
					clear a joist (dashed: where the even grid put it)
				</span>
				<span>
					<span className="mr-1 inline-block h-0.5 w-4 bg-ink-300 align-middle" /> ceiling joist
				</span>
			</figcaption>
		</figure>
	);
}
