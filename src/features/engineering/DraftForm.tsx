/**
 * The drafting form: the choices that make a CoilSpec, in the user's units. It is controlled by
 * the line's page, which recalculates on the server after each change (debounced).
 */
import type { ReactNode } from 'react';
import { THERMAL_CLASS_VALUES } from '../../contracts/coil';
import { SelectField, TextField } from '../../components/Field';
import { formatNumber, type UnitFormatters } from '../../lib/units';
import { AWG_GAUGES, METRIC_DIAMETERS_MM, type DraftValues } from './specModel';

export type DraftErrors = Partial<Record<keyof DraftValues, string>>;

type Props = {
  values: DraftValues;
  onChange: (change: Partial<DraftValues>) => void;
  errors: DraftErrors;
  u: UnitFormatters;
  disabled?: boolean;
  /** Shown under the magnetic-circuit switch when the requirement has none. */
  requirementHasCircuit: boolean;
};

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-3 border-t border-graphite-200 pt-3 first:border-t-0 first:pt-0">
      <legend className="float-left mb-1 w-full text-xs font-bold tracking-wider text-graphite-500 uppercase">{title}</legend>
      {children}
    </fieldset>
  );
}

const grid = 'grid grid-cols-2 gap-3 sm:grid-cols-3';

export function DraftForm({ values: v, onChange, errors: e, u, disabled, requirementHasCircuit }: Props) {
  const L = u.lengthSymbol;
  const num = (key: keyof DraftValues, label: string, hint?: ReactNode, extra: Record<string, unknown> = {}) => (
    <TextField
      label={label}
      name={key}
      inputMode="decimal"
      autoComplete="off"
      value={String(v[key])}
      onChange={(ev) => onChange({ [key]: ev.target.value } as Partial<DraftValues>)}
      error={e[key]}
      hint={hint}
      disabled={disabled}
      {...extra}
    />
  );
  const inchNote = (mm: number) => (u.prefs.lengthUnit === 'in' ? ` (${u.length(mm / 1000, 4)})` : '');

  return (
    <form className="flex flex-col gap-4" onSubmit={(ev) => ev.preventDefault()} noValidate aria-label="Drafting choices">
      <Section title="Wire">
        <div className={grid}>
          <SelectField label="Conductor" name="conductor" value={v.conductor} onChange={(ev) => onChange({ conductor: ev.target.value as DraftValues['conductor'] })} error={e.conductor} disabled={disabled}>
            <option value="copper">Copper</option>
            <option value="aluminium">Aluminium</option>
          </SelectField>
          <SelectField label="Size standard" name="standard" value={v.standard} onChange={(ev) => onChange({ standard: ev.target.value as DraftValues['standard'] })} disabled={disabled}>
            <option value="AWG">AWG gauge</option>
            <option value="metric">Metric (IEC nominal ⌀)</option>
          </SelectField>
          {v.standard === 'AWG' ? (
            <SelectField label="Wire size" name="gauge" value={v.gauge} onChange={(ev) => onChange({ gauge: ev.target.value })} error={e.gauge} disabled={disabled}>
              {AWG_GAUGES.map((g) => (
                <option key={g} value={String(g)}>
                  AWG {g}
                </option>
              ))}
            </SelectField>
          ) : (
            <SelectField label="Wire size" name="diameterMm" value={v.diameterMm} onChange={(ev) => onChange({ diameterMm: ev.target.value })} error={e.diameterMm} disabled={disabled}>
              {!METRIC_DIAMETERS_MM.some((d) => String(d) === v.diameterMm) && <option value={v.diameterMm}>choose a size…</option>}
              {METRIC_DIAMETERS_MM.map((d) => (
                <option key={d} value={String(d)}>
                  {formatNumber(d, d < 1 ? 3 : 2)} mm{inchNote(d)}
                </option>
              ))}
            </SelectField>
          )}
          <SelectField label="Insulation grade" name="insulationGrade" value={v.insulationGrade} onChange={(ev) => onChange({ insulationGrade: ev.target.value as DraftValues['insulationGrade'] })} error={e.insulationGrade} disabled={disabled}>
            <option value="1">Grade 1 (thin)</option>
            <option value="2">Grade 2</option>
            <option value="3">Grade 3 (thick)</option>
          </SelectField>
          <SelectField label="Pattern" name="pattern" value={v.pattern} onChange={(ev) => onChange({ pattern: ev.target.value as DraftValues['pattern'] })} error={e.pattern} disabled={disabled}>
            <option value="layer">Layer wound</option>
            <option value="orthocyclic">Orthocyclic</option>
            <option value="random">Random wound</option>
          </SelectField>
          {v.pattern === 'random' && num('fillFactor', 'Fill factor (bare)', 'blank: the engine’s default')}
        </div>
      </Section>

      <Section title={`Bobbin and leads (${L})`}>
        <div className={grid}>
          {num('bobbinInner', `Bore ⌀, ${L}`)}
          {num('bobbinOuter', `Outer limit ⌀, ${L}`)}
          {num('bobbinLength', `Traverse, ${L}`)}
          {num('leadLength', `Leads, both together, ${L}`)}
          {num('turns', 'Fixed turns', 'blank: fill the bobbin', { inputMode: 'numeric' })}
        </div>
      </Section>

      <Section title="Drive and duty">
        <div className={grid}>
          <SelectField label="Drive" name="driveKind" value={v.driveKind} onChange={(ev) => onChange({ driveKind: ev.target.value as DraftValues['driveKind'] })} disabled={disabled}>
            <option value="voltage">Voltage</option>
            <option value="current">Current</option>
          </SelectField>
          {v.driveKind === 'voltage' ? num('volts', 'Supply, V DC') : num('amps', 'Current, A DC')}
          {num('dutyPercent', 'Duty cycle, %')}
          {num('ambient', `Ambient, ${u.temperatureSymbol}`)}
          <SelectField label="Thermal class" name="insulationClass" value={v.insulationClass} onChange={(ev) => onChange({ insulationClass: ev.target.value })} error={e.insulationClass} disabled={disabled}>
            {THERMAL_CLASS_VALUES.map((c) => (
              <option key={c} value={String(c)}>
                {c} ({u.temperature(c, 0)})
              </option>
            ))}
          </SelectField>
        </div>
      </Section>

      <Section title="Magnetic circuit">
        <label className="flex items-center gap-2 text-sm font-semibold text-graphite-800">
          <input type="checkbox" checked={v.useCircuit} onChange={(ev) => onChange({ useCircuit: ev.target.checked })} disabled={disabled} className="size-4 accent-copper-600" />
          Iron core with air gap
          {!requirementHasCircuit && <span className="font-normal text-graphite-500">(the requirement names none)</span>}
        </label>
        {v.useCircuit && (
          <div className={grid}>
            {num('mu', 'Relative permeability µr')}
            {num('saturation', 'Saturation, T')}
            {num('ironPath', `Iron path, ${L}`)}
            {num('airGap', `Air gap (each), ${L}`)}
            {num('gapCount', 'Gaps in series', undefined, { inputMode: 'numeric' })}
            {num('area', `Pole area, ${u.areaSymbol}`)}
          </div>
        )}
      </Section>
    </form>
  );
}
