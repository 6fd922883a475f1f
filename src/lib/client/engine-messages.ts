/** Words for the engine's record lists and fields, for messages shown to a person. */
const RECORDS: Record<string, string> = {
	rooms: 'Room',
	panels: 'Panel',
	circuits: 'Circuit',
	loads: 'Load',
};
const FIELDS: Record<string, string> = {
	ratingA: 'rating',
	lengthFt: 'length',
	areaFt2: 'area',
	floorAreaFt2: 'floor area',
	va: 'volt-amperes',
	hp: 'horsepower',
	roomIds: 'room',
	insulationC: 'insulation rating',
	terminalTemperatureC: 'terminal temperature rating',
	peakDemandKW: 'peak demand',
	busRatingA: 'bus rating',
	mainBreakerA: 'main breaker',
	fedFrom: 'fed from',
	multiwireWith: 'multiwire partner',
};

const fieldWords = (name: string) => FIELDS[name] ?? name.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();

/** Names one record of the document (`circuits`, 2) in the caller's own terms, or leaves it to the default ("Circuit 3"). */
export type RecordNamer = (list: string, index: number) => string | undefined;

/**
 * Rewrites the path an engine message starts with ("loads[2].voltage: …") in words ("Load 3,
 * voltage: …"); a message without such a path is returned as it is.
 */
export function engineMessageInWords(line: string, nameOf?: RecordNamer): string {
	const m = /^([A-Za-z][\w.[\]]*): ([\s\S]*)$/.exec(line);
	if (!m) return line;
	const [, path, message] = m as unknown as [string, string, string];
	const parts = [...path.matchAll(/([A-Za-z]\w*)|\[(\d+)\]/g)];
	const segments: string[] = [];
	let fields: string[] = [];
	const endFields = () => {
		if (fields.length) segments.push(fields.join(' '));
		fields = [];
	};
	for (let i = 0; i < parts.length; i++) {
		const name = parts[i]![1];
		if (name === undefined) continue;
		const index = parts[i + 1]?.[2];
		if (index === undefined) {
			fields.push(fieldWords(name));
			continue;
		}
		i++;
		const n = Number(index);
		endFields();
		const record = RECORDS[name];
		segments.push(record ? (nameOf?.(name, n) ?? `${record} ${n + 1}`) : `${fieldWords(name)} ${n + 1}`);
	}
	endFields();
	const words = segments.join(', ');
	return `${words.charAt(0).toUpperCase()}${words.slice(1)}: ${message}`;
}
