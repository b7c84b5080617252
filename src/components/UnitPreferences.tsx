import { useId } from 'react';
import { LENGTH_UNITS, TEMPERATURE_UNITS } from '../contracts/auth';
import { errorMessage } from '../lib/api';
import { useCurrentUser, useUpdatePreferences } from '../lib/session';
import { lengthSymbol, temperatureSymbol } from '../lib/units';

const LENGTH_NAMES = { mm: 'Millimetres', in: 'Inches' } as const;
const TEMPERATURE_NAMES = { C: 'Celsius', F: 'Fahrenheit' } as const;

/** Two radio groups (lengths, temperatures) that save at once via PATCH /api/me. */
export function UnitPreferences({ large = false }: { large?: boolean }) {
  const user = useCurrentUser();
  const save = useUpdatePreferences();
  const name = useId();
  const option = `flex cursor-pointer items-center gap-2 rounded-md border px-3 ${large ? 'h-12' : 'h-9'} text-sm font-semibold has-[:checked]:border-copper-600 has-[:checked]:bg-copper-50 has-[:checked]:text-copper-800 border-graphite-300 text-graphite-700 hover:bg-graphite-50`;
  return (
    <div className="flex flex-col gap-3">
      <fieldset className="flex flex-col gap-1.5" disabled={save.isPending}>
        <legend className="mb-1 text-sm font-semibold text-graphite-800">Lengths</legend>
        <div className="flex gap-2">
          {LENGTH_UNITS.map((u) => (
            <label key={u} className={option}>
              <input
                type="radio"
                name={`${name}-length`}
                value={u}
                checked={user.lengthUnit === u}
                onChange={() => save.mutate({ lengthUnit: u })}
                className="accent-copper-600"
              />
              {LENGTH_NAMES[u]} ({lengthSymbol(u)})
            </label>
          ))}
        </div>
      </fieldset>
      <fieldset className="flex flex-col gap-1.5" disabled={save.isPending}>
        <legend className="mb-1 text-sm font-semibold text-graphite-800">Temperatures</legend>
        <div className="flex gap-2">
          {TEMPERATURE_UNITS.map((u) => (
            <label key={u} className={option}>
              <input
                type="radio"
                name={`${name}-temperature`}
                value={u}
                checked={user.temperatureUnit === u}
                onChange={() => save.mutate({ temperatureUnit: u })}
                className="accent-copper-600"
              />
              {TEMPERATURE_NAMES[u]} ({temperatureSymbol(u)})
            </label>
          ))}
        </div>
      </fieldset>
      {save.isError && (
        <p className="text-sm font-medium text-fault" role="alert">
          Not saved: {errorMessage(save.error)}
        </p>
      )}
    </div>
  );
}
