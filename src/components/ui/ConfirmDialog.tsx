import { useEffect, useId, useRef } from 'react';

interface Props {
	open: boolean;
	title: string;
	body: string;
	confirmLabel: string;
	cancelLabel?: string;
	busy?: boolean;
	onConfirm: () => void;
	onCancel: () => void;
}

/** A modal question before something that cannot be undone (native <dialog>: focus trap and Escape for free). */
export default function ConfirmDialog({
	open,
	title,
	body,
	confirmLabel,
	cancelLabel = 'Cancel',
	busy = false,
	onConfirm,
	onCancel,
}: Props) {
	const ref = useRef<HTMLDialogElement>(null);
	const titleId = useId();
	useEffect(() => {
		const d = ref.current;
		if (!d) return;
		if (open && !d.open) d.showModal();
		if (!open && d.open) d.close();
	}, [open]);
	return (
		<dialog
			ref={ref}
			onCancel={(e) => {
				e.preventDefault();
				onCancel();
			}}
			aria-labelledby={titleId}
			className="w-[min(28rem,92vw)] rounded-lg border border-ink-200 p-0 shadow-xl backdrop:bg-ink-950/40"
		>
			<div className="p-5">
				<h2 id={titleId} className="text-lg font-bold text-ink-950">
					{title}
				</h2>
				<p className="mt-2 text-ink-700">{body}</p>
				<div className="mt-5 flex justify-end gap-2">
					<button type="button" className="btn-quiet" onClick={onCancel} autoFocus>
						{cancelLabel}
					</button>
					<button
						type="button"
						className="btn bg-signal-violation text-white hover:bg-red-800"
						onClick={onConfirm}
						disabled={busy}
					>
						{busy ? 'Working…' : confirmLabel}
					</button>
				</div>
			</div>
		</dialog>
	);
}
