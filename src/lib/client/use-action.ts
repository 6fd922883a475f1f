import { useCallback, useState } from 'react';
import { messageOf } from './api-client';

/**
 * A button's or small form's request: `busy` while it runs, the failure in words after. `run`
 * resolves true when the request succeeded, so the caller can move on (reload, close a dialog).
 */
export function useAction() {
	const [busy, setBusy] = useState(false);
	const [error, setError] = useState<string | null>(null);
	const run = useCallback(async (request: () => Promise<unknown>): Promise<boolean> => {
		setBusy(true);
		setError(null);
		try {
			await request();
			return true;
		} catch (err) {
			setError(messageOf(err));
			return false;
		} finally {
			setBusy(false);
		}
	}, []);
	return { busy, error, setError, run };
}
