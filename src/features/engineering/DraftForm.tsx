/**
 * The drafting form: the choices that make a CoilSpec, in the user's units. It is controlled by
 * the line's page, which recalculates on the server after each change (debounced).
 */
import type { ReactNode } from 'react';
import { THERMAL_CLASS_VALUES, type CoilReferenceResponse } from '../../contracts/coil';
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
  /** The engine's core-material library (from /api/coil/reference), for the iron's B–H curve. */
  coreMaterials?: CoilReferenceResponse['coreMaterials'];
};

type Material = CoilReferenceResponse['coreMaterials'][number];

/** The library material whose curve the form holds ('' = linear μr, 'custom' = a curve from elsewhere). */
function materialOf(curve: DraftValues['bhCurve'], materials: Material[]): string {
  if (!curve) return '';
  const key = JSON.stringify(curve);
  return materials.find((m) => m.bhCurve && JSON.stringify(m.bhCurve) === key)?.id ?? 'custom';
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <fieldset className="flex flex-col gap-3 border-t border-graphite-200 pt-3 first:border-t-0 first:pt-0">
      <legend className="float-left mb-1 w-full text-xs font-bold tracking-wider text-graphite-500 uppercase">{title}</legend>
      {children}
    </fieldset>
  );
}

const grid = 'grid grid-cols-2 gap-3 sm:grid-cols-3';

export function DraftForm({ values: v, onChange, errors: e, u, disabled, requirementHasCircuit, coreMaterials = [] }: Props) {
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
          {v.pattern === 'random' && num('packing', 'Packing, turns per d²', 'blank: 0.9 (at most 1.155, close packing)')}
        </div>
      </Section>

      <Section title={`Bobbin and leads (${L})`}>
        <div className={grid}>
          {num('bobbinInner', `Bore ⌀, ${L}`)}
          {num('bobbinOuter', `Outer limit ⌀, ${L}`)}
          {num('bobbinLength', `Traverse, ${L}`)}
          {num('leadLength', `Leads, both together, ${L}`, 'blank: none')}
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
          {num('cycleTime', 'Cycle time, s', 'blank: duty as average power')}
          {num('ambient', `Ambient (rated), ${u.temperatureSymbol}`)}
          {num('ambientMax', `Highest ambient, ${u.temperatureSymbol}`, 'blank: the rated ambient')}
          {num('supplyLowPct', 'Supply low end, % of rated', 'blank: 85 %')}
          {num('supplyHighPct', 'Supply high end, % of rated', 'blank: 110 %')}
          <SelectField label="Thermal class" name="insulationClass" value={v.insulationClass} onChange={(ev) => onChange({ insulationClass: ev.target.value })} error={e.insulationClass} disabled={disabled}>
            {THERMAL_CLASS_VALUES.map((c) => (
              <option key={c} value={String(c)}>
                {c} ({u.temperature(c, 0)})
              </option>
            ))}
          </SelectField>
        </div>
      </Section>

      <Section title="Switch-off">
        <div className={grid}>
          <SelectField
            label="Suppression across the coil"
            name="suppressionKind"
            value={v.suppressionKind}
            onChange={(ev) => onChange({ suppressionKind: ev.target.value as DraftValues['suppressionKind'] })}
            error={e.suppressionKind}
            hint={v.suppressionKind === '' ? 'a diode is assumed' : v.suppressionKind === 'none' ? 'the spike is limited only by arcing' : undefined}
            disabled={disabled}
          >
            <option value="">Not stated</option>
            <option value="diode">Diode</option>
            <option value="diode-zener">Diode and Zener</option>
            <option value="tvs">TVS</option>
            <option value="none">None</option>
          </SelectField>
          {(v.suppressionKind === 'diode-zener' || v.suppressionKind === 'tvs') &&
            num('clampVoltage', v.suppressionKind === 'tvs' ? 'TVS clamp voltage, V' : 'Zener voltage, V')}
          {v.suppressionKind === 'diode' && num('clampVoltage', 'Diode forward drop, V', 'blank: 0.7 V')}
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
            <SelectField
              label="Iron (B–H curve)"
              name="coreMaterial"
              value={materialOf(v.bhCurve, coreMaterials)}
              disabled={disabled}
              hint={v.bhCurve ? `${v.bhCurve.length} points; the knee is the saturation field` : 'linear µr, capped at saturation'}
              onChange={(ev) => {
                const m = coreMaterials.find((x) => x.id === ev.target.value);
                if (!ev.target.value) onChange({ bhCurve: null });
                else if (m) onChange({ bhCurve: m.bhCurve ?? null, mu: String(m.relativePermeability), saturation: String(m.saturationFluxDensity) });
              }}
            >
              <option value="">Linear µr</option>
              {materialOf(v.bhCurve, coreMaterials) === 'custom' && <option value="custom">Curve of this sheet</option>}
              {coreMaterials
                .filter((m) => m.bhCurve)
                .map((m) => (
                  <option key={m.id} value={m.id}>
                    {m.name}
                  </option>
                ))}
            </SelectField>
            {num('mu', 'Relative permeability µr')}
            {num('saturation', v.bhCurve ? 'Knee of the curve, T' : 'Saturation, T')}
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
