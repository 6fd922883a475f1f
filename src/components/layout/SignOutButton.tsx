import { useState } from 'react';
import { signOutNow } from '../../lib/client/auth-client';

export default function SignOutButton() {
	const [busy, setBusy] = useState(false);
	return (
		<button
			type="button"
			className="rounded-md px-3 py-1.5 text-sm font-semibold text-ink-100 hover:bg-ink-800"
			disabled={busy}
			onClick={async () => {
				setBusy(true);
				await signOutNow();
			}}
		>
			{busy ? 'Signing out…' : 'Sign out'}
		</button>
	);
}
