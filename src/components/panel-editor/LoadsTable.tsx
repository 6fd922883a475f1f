import { useState } from 'react';
import {
	Controller,
	useFieldArray,
	type Control,
	type FieldErrors,
	type UseFormRegister,
	type UseFormSetValue,
	type UseFormWatch,
} from 'react-hook-form';
import type { RoomRecord } from '../../lib/client/job-tree';
import type { LOAD_KINDS } from '../../lib/electrical/schema';
import { MOTOR_HP } from '../../lib/electrical/tables';
import { asNumber, asNumberOrNull } from '../jobs/form-helpers';
import type { CircuitFormInput, LoadRowInput } from './editor-schema';
import RoomPicker from './RoomPicker';

export const LOAD_KIND_LABELS: Record<(typeof LOAD_KINDS)[number], string> = {
	lighting: 'Lighting',
	receptacles: 'Receptacles',
	'small-appliance': 'Small appliance',
	laundry: 'Laundry',
	'fixed-appliance': 'Fixed appliance',
	motor: 'Motor',
	'hvac-heat': 'Space heating',
	'hvac-cool': 'Air conditioning',
	'heat-pump': 'Heat pump',
	'water-heater': 'Water heater',
	range: 'Range / cooking',
	dryer: 'Dryer',
	'ev-charger': 'EV charger (EVSE)',
	other: 'Other',
};

type Unit = 'va' | 'watts' | 'hp';

/** A new, empty load row. */
export function newLoadRow(voltage: 120 | 208 | 240): LoadRowInput {
	return {
		record: null,
		load: {
			kind: 'receptacles',
			description: '',
			quantity: 1,
			va: 180,
			watts: null,
			hp: null,
			voltage,
			continuous: false,
			cordAndPlug: false,
			status: null,
			spaceHeating: null,
			roomIds: [],
		},
	};
}

function unitOf(l: LoadRowInput['load']): Unit {
	if (l.hp !== null && l.hp !== undefined) return 'hp';
	if (l.watts !== null && l.watts !== undefined) return 'watts';
	return 'va';
}

interface Props {
	control: Control<CircuitFormInput>;
	register: UseFormRegister<CircuitFormInput>;
	watch: UseFormWatch<CircuitFormInput>;
	setValue: UseFormSetValue<CircuitFormInput>;
	errors: FieldErrors<CircuitFormInput>;
	rooms: RoomRecord[];
	defaultVoltage: 120 | 208 | 240;
}

/** The circuit's loads in an editable table: kind, quantity, rating (VA, W or hp), voltage, continuous, rooms served. */
export default function LoadsTable({
	control,
	register,
	watch,
	setValue,
	errors,
	rooms,
	defaultVoltage,
}: Props) {
	const { fields, append, remove } = useFieldArray({ control, name: 'loads' });
	return (
		<div>
			<div className="relative overflow-x-auto rounded-md border border-ink-200">
				<table className="w-full min-w-[56rem] text-left text-sm" data-testid="loads-table">
					<caption className="sr-only">Loads on this circuit</caption>
					<thead className="bg-ink-50 text-xs uppercase tracking-wide text-ink-500">
						<tr>
							<th className="px-2 py-2">Kind</th>
							<th className="px-2 py-2">Description</th>
							<th className="px-2 py-2">Qty</th>
							<th className="px-2 py-2">Rating each</th>
							<th className="px-2 py-2">Volts</th>
							<th className="px-2 py-2">Continuous</th>
							<th className="px-2 py-2">Rooms served</th>
							<th className="px-2 py-2">
								<span className="sr-only">Remove</span>
							</th>
						</tr>
					</thead>
					<tbody className="divide-y divide-ink-100">
						{fields.length === 0 && (
							<tr>
								<td colSpan={8} className="px-2 py-3 text-ink-500">
									No loads yet. Add what the circuit feeds.
								</td>
							</tr>
						)}
						{fields.map((f, i) => (
							<LoadRow
								key={f.id}
								i={i}
								register={register}
								watch={watch}
								setValue={setValue}
								control={control}
								errors={errors}
								rooms={rooms}
								onRemove={() => remove(i)}
							/>
						))}
					</tbody>
				</table>
			</div>
			<button type="button" className="btn-quiet mt-2" onClick={() => append(newLoadRow(defaultVoltage))}>
				Add a load
			</button>
		</div>
	);
}

function LoadRow({
	i,
	register,
	watch,
	setValue,
	control,
	errors,
	rooms,
	onRemove,
}: Omit<Props, 'defaultVoltage'> & { i: number; onRemove: () => void }) {
	const row = watch(`loads.${i}.load`);
	const [unit, setUnit] = useState<Unit>(() => unitOf(row));
	const e = errors.loads?.[i]?.load;
	const msg = (k: keyof NonNullable<typeof e>) => (e?.[k] as { message?: string } | undefined)?.message;
	const ratingError =
		msg('va') ??
		msg('watts') ??
		msg('hp') ??
		(e?.root?.message as string | undefined) ??
		(errors.loads?.[i]?.load as { message?: string } | undefined)?.message;
	const p = `load-${i}`;
	const changeUnit = (next: Unit) => {
		const current = row[unit];
		setValue(`loads.${i}.load.va`, null, { shouldDirty: true });
		setValue(`loads.${i}.load.watts`, null, { shouldDirty: true });
		setValue(`loads.${i}.load.hp`, null, { shouldDirty: true });
		if (next === 'hp') setValue(`loads.${i}.load.hp`, '1/2', { shouldDirty: true, shouldValidate: true });
		else
			setValue(`loads.${i}.load.${next}`, typeof current === 'number' ? current : 1000, {
				shouldDirty: true,
				shouldValidate: true,
			});
		setUnit(next);
	};
	const cell = 'px-2 py-1.5 align-top';
	const input = 'field-input px-2 py-1 text-sm';
	const err = (m?: string, id?: string) =>
		m ? (
			<p id={id} className="field-error text-xs" role="alert">
				{m}
			</p>
		) : null;
	const voltageError = msg('voltage');
	return (
		<>
			<tr data-load-row={i}>
				<td className={cell}>
					<select
						aria-label={`Load ${i + 1} kind`}
						{...register(`loads.${i}.load.kind`)}
						className={`${input} min-w-[9.5rem]`}
					>
						{Object.entries(LOAD_KIND_LABELS).map(([k, label]) => (
							<option key={k} value={k}>
								{label}
							</option>
						))}
					</select>
				</td>
				<td className={cell}>
					<input
						aria-label={`Load ${i + 1} description`}
						{...register(`loads.${i}.load.description`)}
						className={`${input} min-w-[8rem]`}
					/>
					{err(msg('description'))}
				</td>
				<td className={cell}>
					<input
						aria-label={`Load ${i + 1} quantity`}
						inputMode="numeric"
						{...register(`loads.${i}.load.quantity`, { setValueAs: asNumber })}
						aria-invalid={msg('quantity') ? true : undefined}
						className={`${input} w-16`}
					/>
					{err(msg('quantity'))}
				</td>
				<td className={cell}>
					<div className="flex gap-1">
						{unit === 'hp' ? (
							<select
								aria-label={`Load ${i + 1} horsepower`}
								{...register(`loads.${i}.load.hp`)}
								className={`${input} w-24`}
							>
								{MOTOR_HP.map((h) => (
									<option key={h} value={h}>
										{h}
									</option>
								))}
							</select>
						) : (
							<input
								aria-label={`Load ${i + 1} rating in ${unit === 'va' ? 'volt-amperes' : 'watts'}`}
								inputMode="decimal"
								{...register(`loads.${i}.load.${unit}`, { setValueAs: asNumberOrNull })}
								aria-invalid={ratingError ? true : undefined}
								className={`${input} w-24`}
							/>
						)}
						<select
							aria-label={`Load ${i + 1} rating unit`}
							value={unit}
							onChange={(ev) => changeUnit(ev.target.value as Unit)}
							className={`${input} w-[4.5rem]`}
						>
							<option value="va">VA</option>
							<option value="watts">W</option>
							<option value="hp">hp</option>
						</select>
					</div>
					{err(ratingError)}
				</td>
				<td className={cell}>
					<select
						aria-label={`Load ${i + 1} voltage`}
						{...register(`loads.${i}.load.voltage`, { setValueAs: asNumber })}
						aria-invalid={voltageError ? true : undefined}
						aria-describedby={voltageError ? `${p}-voltage-error` : undefined}
						className={`${input} w-20`}
					>
						{[120, 208, 240].map((v) => (
							<option key={v} value={v}>
								{v} V
							</option>
						))}
					</select>
				</td>
				<td className={`${cell} text-center`}>
					<input
						type="checkbox"
						aria-label={`Load ${i + 1} continuous (3 hours or more)`}
						{...register(`loads.${i}.load.continuous`)}
						className="mt-2 h-4 w-4 accent-copper-600"
					/>
				</td>
				<td className={cell}>
					<Controller
						control={control}
						name={`loads.${i}.load.roomIds`}
						render={({ field }) => (
							<RoomPicker
								id={`${p}-rooms`}
								legend={`Load ${i + 1} rooms served`}
								rooms={rooms}
								value={field.value ?? []}
								onChange={field.onChange}
								compact
							/>
						)}
					/>
				</td>
				<td className={cell}>
					<button
						type="button"
						className="btn-quiet px-2 py-1 text-xs"
						onClick={onRemove}
						aria-label={`Remove load ${i + 1}`}
					>
						Remove
					</button>
				</td>
			</tr>
			{voltageError && (
				<tr data-load-error={i}>
					<td colSpan={8} className="px-2 pb-2">
						<p
							id={`${p}-voltage-error`}
							role="alert"
							className="field-error sticky left-2 max-w-[min(36rem,calc(100vw-5rem))] text-xs"
						>
							Load {i + 1} voltage: {voltageError}
						</p>
					</td>
				</tr>
			)}
		</>
	);
}
