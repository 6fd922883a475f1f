import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import type { z } from 'zod';
import { api } from '../../lib/client/api-client';
import type { CommentView } from '../../lib/repositories/review-comments';
import {
	COMMENT_STATUS_LABELS,
	commentEntrySchema,
	type CommentAction,
} from '../../lib/schemas/review-comment';
import { formErrorMessage } from '../jobs/form-helpers';
import Notice from '../ui/Notice';

type Input = z.input<typeof commentEntrySchema>;
type Values = z.output<typeof commentEntrySchema>;

const STATUS_LOOK: Record<CommentView['status'], string> = {
	open: 'bg-red-50 text-signal-violation',
	addressed: 'bg-amber-50 text-signal-warning',
	resolved: 'bg-green-50 text-signal-ok',
};

const ENTRY_WORDS: Record<CommentAction, string> = {
	reply: 'answered',
	addressed: 'marked it addressed',
	resolved: 'resolved it',
	reopened: 'reopened it',
};

const when = (iso: string) =>
	new Date(iso).toLocaleString('en-US', { dateStyle: 'medium', timeStyle: 'short' });

/** The status of a review comment in words. */
export function CommentStatusTag({ status }: { status: CommentView['status'] }) {
	return (
		<span
			className={`rounded px-2 py-0.5 text-xs font-semibold ${STATUS_LOOK[status]}`}
			data-comment-status={status}
		>
			{COMMENT_STATUS_LABELS[status]}
		</span>
	);
}

interface Props {
	comment: CommentView;
	/** Which side this screen is for: the contractor answers and marks addressed; the reviewer resolves or reopens. */
	side: 'contractor' | 'inspector' | 'reader';
	onChanged: (comment: CommentView) => void;
	highlighted?: boolean;
	onShow?: () => void;
}

/** One review comment with its thread, and the answers and status changes open to this side. */
export default function CommentThread({ comment, side, onChanged, highlighted, onShow }: Props) {
	const [message, setMessage] = useState<string | null>(null);
	const form = useForm<Input, unknown, Values>({
		resolver: zodResolver(commentEntrySchema),
		defaultValues: { action: 'reply', body: '' },
	});
	const {
		register,
		handleSubmit,
		setValue,
		setError,
		reset,
		formState: { errors, isSubmitting },
	} = form;
	const send = handleSubmit(async (values) => {
		setMessage(null);
		try {
			const res = await api<{ comment: CommentView }>(`/api/comments/${comment.id}/entries`, {
				method: 'POST',
				body: values,
			});
			reset({ action: 'reply', body: '' });
			onChanged(res.comment);
		} catch (err) {
			setMessage(formErrorMessage(err, setError, ['body', 'action']));
		}
	});
	const act = (action: CommentAction) => {
		setValue('action', action);
		void send();
	};
	const bodyId = `entry-${comment.id}`;
	const actions: { action: CommentAction; label: string; primary?: boolean }[] =
		side === 'contractor'
			? [
					{ action: 'reply', label: 'Send answer' },
					...(comment.status === 'open'
						? [{ action: 'addressed' as const, label: 'Mark addressed', primary: true }]
						: []),
				]
			: side === 'inspector'
				? [
						{ action: 'reply', label: 'Send reply' },
						...(comment.status !== 'resolved'
							? [{ action: 'resolved' as const, label: 'Resolve', primary: true }]
							: []),
						...(comment.status !== 'open' ? [{ action: 'reopened' as const, label: 'Reopen' }] : []),
					]
				: [];

	return (
		<article
			className={`rounded-md border p-3 ${highlighted ? 'border-copper-500 ring-2 ring-copper-200' : 'border-ink-200'}`}
			data-testid="comment"
			data-comment={comment.id}
			aria-labelledby={`c-${comment.id}-h`}
		>
			<header className="flex flex-wrap items-center gap-2">
				<h3 id={`c-${comment.id}-h`} className="font-bold text-ink-950">
					#{comment.number}{' '}
					{onShow && comment.targetKind === 'sheet' ? (
						<button type="button" className="underline" onClick={onShow}>
							{comment.targetLabel}
						</button>
					) : (
						comment.targetLabel
					)}
				</h3>
				<CommentStatusTag status={comment.status} />
				<span className="text-xs text-ink-500">rev {comment.revision}</span>
			</header>
			<p className="mt-1 whitespace-pre-line text-ink-900">{comment.body}</p>
			<p className="text-xs text-ink-500">
				{comment.authorName ?? 'A former reviewer'} · {when(comment.createdAt)}
			</p>
			{comment.entries.length > 0 && (
				<ol className="mt-2 space-y-1 border-l-2 border-ink-100 pl-3 text-sm">
					{comment.entries.map((e) => (
						<li key={e.id} data-entry={e.action}>
							<span className="font-semibold">{e.authorName ?? 'Someone no longer here'}</span>{' '}
							{ENTRY_WORDS[e.action]}
							<span className="text-xs text-ink-500"> · {when(e.createdAt)}</span>
							{e.body && <p className="whitespace-pre-line text-ink-800">{e.body}</p>}
						</li>
					))}
				</ol>
			)}
			{actions.length > 0 && (
				<form className="mt-2" onSubmit={(e) => e.preventDefault()} noValidate>
					<input type="hidden" {...register('action')} />
					<label htmlFor={bodyId} className="sr-only">
						{side === 'contractor' ? 'Your answer' : 'Your reply'}
					</label>
					<textarea
						id={bodyId}
						rows={2}
						className="field-input text-sm"
						placeholder={
							side === 'contractor' ? 'What you changed, and where' : 'Reply (optional when resolving)'
						}
						aria-invalid={errors.body ? true : undefined}
						aria-describedby={errors.body ? `${bodyId}-err` : undefined}
						{...register('body')}
					/>
					{errors.body && (
						<p id={`${bodyId}-err`} className="field-error">
							{errors.body.message}
						</p>
					)}
					<div className="mt-2 flex flex-wrap gap-2">
						{actions.map((a) => (
							<button
								key={a.action}
								type="button"
								className={a.primary ? 'btn-primary px-3 py-1' : 'btn-quiet px-3 py-1'}
								disabled={isSubmitting}
								onClick={() => act(a.action)}
							>
								{a.label}
							</button>
						))}
					</div>
					{message && (
						<div className="mt-2">
							<Notice tone="error">{message}</Notice>
						</div>
					)}
				</form>
			)}
		</article>
	);
}
