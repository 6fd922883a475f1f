import { useCallback, useEffect, useRef, useState } from 'react';
import type * as PdfJs from 'pdfjs-dist/legacy/build/pdf.mjs';
import type { PDFDocumentProxy, RenderTask } from 'pdfjs-dist/legacy/build/pdf.mjs';

/** A comment's pin on a sheet: a point as fractions of the page (0..1 from the left and the top). */
export interface SheetPin {
	id: string;
	number: number;
	sheet: number;
	x: number;
	y: number;
	status: 'open' | 'addressed' | 'resolved';
}

interface Props {
	/** The stored packet of the revision. */
	url: string;
	/** When set, a click on the page picks a point for a new comment. */
	onPick?: (sheet: number, x: number, y: number) => void;
	pins: SheetPin[];
	/** The point picked for the comment being written, shown until it is saved. */
	draft?: { sheet: number; x: number; y: number } | null;
	onPinClick?: (id: string) => void;
}

const ZOOMS = [0.5, 0.75, 1, 1.25, 1.5, 2, 3] as const;
const THUMB_WIDTH = 96;

// pdf.js is loaded on first use, in the browser only, with its worker served from our own build
// (the legacy build runs in older browsers too).
let loader: Promise<typeof PdfJs> | null = null;
function pdfjs() {
	loader ??= Promise.all([
		import('pdfjs-dist/legacy/build/pdf.mjs'),
		import('pdfjs-dist/legacy/build/pdf.worker.min.mjs?url'),
	]).then(([lib, worker]) => {
		lib.GlobalWorkerOptions.workerSrc = worker.default;
		return lib;
	});
	return loader;
}

const PIN_LOOK: Record<SheetPin['status'], string> = {
	open: 'bg-signal-violation text-white',
	addressed: 'bg-signal-warning text-white',
	resolved: 'bg-signal-ok text-white',
};

/**
 * The submitted packet drawn page by page on canvas with pdf.js: thumbnails, page navigation, zoom
 * (fit to width or steps), and the comments' pins on each sheet. A click on the page picks a point.
 */
export default function PacketViewer({ url, onPick, pins, draft, onPinClick }: Props) {
	const [doc, setDoc] = useState<PDFDocumentProxy | null>(null);
	const [error, setError] = useState<string | null>(null);
	const [page, setPage] = useState(1);
	const [zoom, setZoom] = useState<'fit' | number>('fit');
	const [size, setSize] = useState<{ width: number; height: number } | null>(null);
	const [rendered, setRendered] = useState(0);
	const [scale, setScale] = useState(1);
	const frame = useRef<HTMLDivElement>(null);
	const canvas = useRef<HTMLCanvasElement>(null);
	const [frameWidth, setFrameWidth] = useState(0);

	useEffect(() => {
		let gone = false;
		let loaded: PDFDocumentProxy | null = null;
		setDoc(null);
		setError(null);
		pdfjs()
			.then((lib) => lib.getDocument({ url, isEvalSupported: false, withCredentials: true }).promise)
			.then((d) => {
				loaded = d;
				if (gone) void d.destroy();
				else {
					setDoc(d);
					setPage(1);
				}
			})
			.catch(() => {
				if (!gone) setError('The packet could not be shown. Reload the page to try again, or download it.');
			});
		return () => {
			gone = true;
			void loaded?.destroy();
		};
	}, [url]);

	useEffect(() => {
		const el = frame.current;
		if (!el) return;
		const observer = new ResizeObserver(() => setFrameWidth(el.clientWidth));
		observer.observe(el);
		setFrameWidth(el.clientWidth);
		return () => observer.disconnect();
	}, []);

	useEffect(() => {
		if (!doc || !canvas.current || frameWidth === 0) return;
		let task: RenderTask | null = null;
		let gone = false;
		void doc.getPage(page).then((p) => {
			if (gone) return;
			const base = p.getViewport({ scale: 1 });
			const scale = zoom === 'fit' ? Math.max(0.2, (frameWidth - 2) / base.width) : zoom;
			const viewport = p.getViewport({ scale });
			const ratio = window.devicePixelRatio || 1;
			const c = canvas.current!;
			c.width = Math.floor(viewport.width * ratio);
			c.height = Math.floor(viewport.height * ratio);
			c.style.width = `${Math.floor(viewport.width)}px`;
			c.style.height = `${Math.floor(viewport.height)}px`;
			setSize({ width: Math.floor(viewport.width), height: Math.floor(viewport.height) });
			setScale(scale);
			task = p.render({
				canvasContext: c.getContext('2d')!,
				viewport,
				transform: ratio === 1 ? undefined : [ratio, 0, 0, ratio, 0, 0],
			});
			task.promise.then(
				() => !gone && setRendered((n) => n + 1),
				() => undefined,
			);
		});
		return () => {
			gone = true;
			task?.cancel();
		};
	}, [doc, page, zoom, frameWidth]);

	const pick = useCallback(
		(e: React.MouseEvent<HTMLDivElement>) => {
			if (!onPick) return;
			const box = e.currentTarget.getBoundingClientRect();
			const x = Math.min(1, Math.max(0, (e.clientX - box.left) / box.width));
			const y = Math.min(1, Math.max(0, (e.clientY - box.top) / box.height));
			onPick(page, Math.round(x * 10_000) / 10_000, Math.round(y * 10_000) / 10_000);
		},
		[onPick, page],
	);

	const pages = doc?.numPages ?? 0;
	const zoomIndex = zoom === 'fit' ? -1 : ZOOMS.indexOf(zoom as (typeof ZOOMS)[number]);
	const stepZoom = (dir: 1 | -1) => {
		const current = zoom === 'fit' ? scale : zoom;
		const next =
			dir === 1
				? ZOOMS.find((z) => z > current + 0.01)
				: [...ZOOMS].reverse().find((z) => z < current - 0.01);
		if (next) setZoom(next);
	};
	const onSheet = pins.filter((p) => p.sheet === page);

	return (
		<div
			className="flex min-h-[32rem] gap-3"
			data-testid="packet-viewer"
			data-rendered={rendered > 0 ? 'true' : 'false'}
		>
			<ol
				aria-label="Sheets of the packet"
				className="hidden max-h-[80vh] w-[7.5rem] shrink-0 space-y-2 overflow-y-auto pr-1 md:block"
			>
				{doc &&
					Array.from({ length: pages }, (_, i) => i + 1).map((n) => (
						<li key={n}>
							<Thumbnail
								doc={doc}
								number={n}
								current={n === page}
								pins={pins.filter((p) => p.sheet === n).length}
								onClick={() => setPage(n)}
							/>
						</li>
					))}
			</ol>
			<div className="min-w-0 flex-1">
				<div
					className="mb-2 flex flex-wrap items-center gap-2 text-sm"
					role="toolbar"
					aria-label="Packet view"
				>
					<button
						type="button"
						className="btn-quiet px-2 py-1"
						onClick={() => setPage((p) => Math.max(1, p - 1))}
						disabled={page <= 1}
					>
						Previous sheet
					</button>
					<span data-testid="sheet-indicator" aria-live="polite">
						Sheet {page} of {pages || '…'}
					</span>
					<button
						type="button"
						className="btn-quiet px-2 py-1"
						onClick={() => setPage((p) => Math.min(pages, p + 1))}
						disabled={page >= pages}
					>
						Next sheet
					</button>
					<span className="mx-2 h-5 w-px bg-ink-200" aria-hidden="true" />
					<button
						type="button"
						className="btn-quiet px-2 py-1"
						onClick={() => stepZoom(-1)}
						aria-label="Zoom out"
					>
						−
					</button>
					<span className="w-14 text-center">{zoom === 'fit' ? 'Fit' : `${Math.round(zoom * 100)} %`}</span>
					<button
						type="button"
						className="btn-quiet px-2 py-1"
						onClick={() => stepZoom(1)}
						aria-label="Zoom in"
						disabled={zoomIndex === ZOOMS.length - 1}
					>
						+
					</button>
					<button
						type="button"
						className="btn-quiet px-2 py-1"
						onClick={() => setZoom('fit')}
						disabled={zoom === 'fit'}
					>
						Fit width
					</button>
					<a className="ml-auto underline" href={url} target="_blank" rel="noopener">
						Open the PDF
					</a>
				</div>
				{error && (
					<p
						role="alert"
						className="rounded-md border border-signal-violation/40 bg-red-50 p-3 text-sm text-signal-violation"
					>
						{error}
					</p>
				)}
				<div ref={frame} className="max-h-[80vh] overflow-auto rounded-md border border-ink-200 bg-ink-100">
					{!doc && !error && <p className="p-6 text-sm text-ink-600">Loading the packet…</p>}
					<div
						className="relative mx-auto"
						style={size ? { width: size.width, height: size.height } : undefined}
					>
						<canvas
							ref={canvas}
							data-testid="packet-canvas"
							data-sheet={page}
							className={size ? 'block bg-white' : 'hidden'}
						/>
						{size && (
							<div
								className={`absolute inset-0 ${onPick ? 'cursor-crosshair' : ''}`}
								onClick={pick}
								data-testid="sheet-overlay"
								aria-label={onPick ? 'Click where the comment belongs' : undefined}
							>
								{onSheet.map((p) => (
									<button
										key={p.id}
										type="button"
										title={`Comment #${p.number}`}
										data-testid="pin"
										data-comment={p.id}
										onClick={(e) => {
											e.stopPropagation();
											onPinClick?.(p.id);
										}}
										className={`absolute flex h-6 min-w-6 -translate-x-1/2 -translate-y-full items-center justify-center rounded-full rounded-bl-none px-1 text-xs font-bold shadow ring-2 ring-white ${PIN_LOOK[p.status]}`}
										style={{ left: `${p.x * 100}%`, top: `${p.y * 100}%` }}
									>
										{p.number}
									</button>
								))}
								{draft && draft.sheet === page && (
									<span
										data-testid="draft-pin"
										className="pointer-events-none absolute h-6 w-6 -translate-x-1/2 -translate-y-full rounded-full rounded-bl-none bg-copper-600 ring-2 ring-white"
										style={{ left: `${draft.x * 100}%`, top: `${draft.y * 100}%` }}
									/>
								)}
							</div>
						)}
					</div>
				</div>
			</div>
		</div>
	);
}

function Thumbnail({
	doc,
	number,
	current,
	pins,
	onClick,
}: {
	doc: PDFDocumentProxy;
	number: number;
	current: boolean;
	pins: number;
	onClick: () => void;
}) {
	const ref = useRef<HTMLCanvasElement>(null);
	useEffect(() => {
		let task: RenderTask | null = null;
		let gone = false;
		void doc.getPage(number).then((p) => {
			if (gone || !ref.current) return;
			const viewport = p.getViewport({ scale: THUMB_WIDTH / p.getViewport({ scale: 1 }).width });
			ref.current.width = Math.floor(viewport.width);
			ref.current.height = Math.floor(viewport.height);
			task = p.render({ canvasContext: ref.current.getContext('2d')!, viewport });
			task.promise.catch(() => undefined);
		});
		return () => {
			gone = true;
			task?.cancel();
		};
	}, [doc, number]);
	return (
		<button
			type="button"
			onClick={onClick}
			aria-current={current ? 'page' : undefined}
			aria-label={`Sheet ${number}${pins ? `, ${pins} comment${pins === 1 ? '' : 's'}` : ''}`}
			data-testid="thumbnail"
			className={`relative block rounded border-2 bg-white ${current ? 'border-copper-500' : 'border-transparent hover:border-ink-300'}`}
		>
			<canvas ref={ref} className="block" style={{ width: THUMB_WIDTH }} />
			<span className="absolute bottom-0 left-0 rounded-tr bg-ink-900/70 px-1 text-xs text-white">
				{number}
			</span>
			{pins > 0 && (
				<span className="absolute right-0 top-0 rounded-bl bg-signal-violation px-1 text-xs font-bold text-white">
					{pins}
				</span>
			)}
		</button>
	);
}
