import { useCallback, useEffect, useRef, useState } from 'react';
import { messageOf } from './api-client';

export interface Resource<T> {
	data: T | null;
	error: string | null;
	loading: boolean;
	/** Loads again (the Retry button, or after a change elsewhere). */
	reload: () => Promise<void>;
	/** Replaces the data in place after a write, without another request. */
	setData: (update: T | ((prev: T | null) => T)) => void;
}

/** Loads data in the browser with loading and error states; reloads when `key` changes. */
export function useResource<T>(load: () => Promise<T>, key: string): Resource<T> {
	const [data, setDataState] = useState<T | null>(null);
	const [error, setError] = useState<string | null>(null);
	const [loading, setLoading] = useState(true);
	const loadRef = useRef(load);
	loadRef.current = load;
	const seq = useRef(0);

	const reload = useCallback(async () => {
		const mine = ++seq.current;
		setLoading(true);
		setError(null);
		try {
			const result = await loadRef.current();
			if (mine === seq.current) setDataState(result);
		} catch (err) {
			if (mine === seq.current) setError(messageOf(err));
		} finally {
			if (mine === seq.current) setLoading(false);
		}
	}, []);

	useEffect(() => {
		void reload();
	}, [reload, key]);

	const setData = useCallback((update: T | ((prev: T | null) => T)) => {
		setDataState((prev) => (typeof update === 'function' ? (update as (p: T | null) => T)(prev) : update));
	}, []);

	return { data, error, loading, reload, setData };
}
