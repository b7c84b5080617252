/**
 * One order line on the engineer's desk: the customer's requirement beside the build sheet being
 * drafted. Every change of the drafting form recalculates on the server (debounced); the sheet,
 * the pictures and the sweep update in place, keeping the last answer while the next computes.
 */
import { useQuery } from '@tanstack/react-query';
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { Link, useParams } from 'react-router';
import type { BuildSheetRecord, OrderLineDetail, ReleaseResponse } from '../../contracts/build-sheets';
import type { CoilSpec } from '../../contracts/coil';
import { STAGE_LABELS } from '../../contracts/stages';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { errorMessage, isApiError } from '../../lib/api';
import { formatDay } from '../../lib/format';
import { useHasRole, useUnits } from '../../lib/session';
import type { UnitFormatters } from '../../lib/units';
import { calculateQuery, engineSheet, lineQuery, lineWorkOrdersQuery, profileQuery, referenceQuery, sweepQuery, useSaveDraft, useSolve, type EngineSheet } from './api';
import { DraftForm } from './DraftForm';
import { describeTarget, FindWireResults } from './FindWire';
import { CrossSection } from './pictures/CrossSection';
import { BHPlot, FieldPlot, PullPlot, WarmUpPlot } from './pictures/Curves';
import { RequirementView } from './RequirementView';
import { ApprovePanel, ReleasePanel, SheetChangesNote, SheetStatusBadge, VersionHistory, WorkOrdersCreated } from './SheetActions';
import { AssumptionsPanel, SheetView } from './SheetView';
import { SweepTable } from './SweepTable';
import {
  anchorsOf,
  canonical,
  draftSchema,
  extrasOf,
  messagesByField,
  specToValues,
  wireSizeLabel,
  wireValues,
  type Anchors,
  type DraftValues,
  type SpecExtras,
  type WireSizeValue,
} from './specModel';

/** Waits until the value has stopped changing for `ms`; compares by canonical JSON. */
function useDebounced<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  const key = canonical(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, ms]);
  return settled;
}

export const RECALC_DELAY_MS = 300;

export function LinePage() {
  const { id } = useParams();
  const lineId = Number(id);
  const line = useQuery({ ...lineQuery(lineId), enabled: Number.isInteger(lineId) && lineId > 0 });
  if (!Number.isInteger(lineId) || lineId <= 0) return <Alert kind="fault" title="No such order line" />;
  if (line.isPending) return <Loading what="Loading the order line" />;
  if (line.isError) {
    return (
      <Alert kind="fault" title={isApiError(line.error) && line.error.status === 404 ? 'No such order line' : 'Could not load the order line'}>
        {errorMessage(line.error)}
      </Alert>
    );
  }
  return <Desk key={line.data.id} line={line.data} />;
}

/** Where the form starts: the newest saved version, else the spec made from the requirement. */
const startSpec = (line: OrderLineDetail): CoilSpec => line.sheets[0]?.spec ?? line.starting.spec;

function Desk({ line }: { line: OrderLineDetail }) {
  const u = useUnits();
  const writer = useHasRole('engineer', 'admin');
  const prefs = u.prefs;
  const [extras, setExtras] = useState<SpecExtras>(() => extrasOf(startSpec(line)));
  const [values, setValues] = useState<DraftValues>(() => specToValues(startSpec(line), prefs));
  const [anchors, setAnchors] = useState<Anchors>(() => anchorsOf(startSpec(line), prefs));
  /** Fills the form from a whole spec (a saved version, the requirement, the same spec in new units). */
  const fill = useCallback((s: CoilSpec, p: typeof prefs) => {
    setExtras(extrasOf(s));
    setValues(specToValues(s, p));
    setAnchors(anchorsOf(s, p));
  }, []);
  const [released, setReleased] = useState<ReleaseResponse | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const schema = useMemo(() => draftSchema(prefs, extras, anchors), [prefs, extras, anchors]);
  const parsed = useMemo(() => schema.safeParse(values), [schema, values]);
  const spec: CoilSpec | null = parsed.success ? (parsed.data as CoilSpec) : null;
  const localErrors = useMemo(() => {
    if (parsed.success) return {};
    const byPath: Record<string, string> = {};
    for (const i of parsed.error.issues) {
      const p = i.path.join('.');
      if (!(p in byPath)) byPath[p] = i.message;
    }
    return byPath;
  }, [parsed]);

  // Units changed elsewhere (the account panel): show the same spec in the new units.
  const lastSpec = useRef<CoilSpec | null>(spec);
  if (spec) lastSpec.current = spec;
  const prefsKey = `${prefs.lengthUnit}/${prefs.temperatureUnit}`;
  const shownPrefs = useRef(prefsKey);
  useEffect(() => {
    if (shownPrefs.current !== prefsKey && lastSpec.current) fill(lastSpec.current, prefs);
    shownPrefs.current = prefsKey;
  }, [prefsKey, prefs, fill]);

  const settled = useDebounced(spec, RECALC_DELAY_MS);
  const waiting = canonical(spec) !== canonical(settled);
  const calc = useQuery(calculateQuery(settled));
  const sweep = useQuery(sweepQuery(settled));
  const profile = useQuery(profileQuery(settled));

  // The sheet shown and the spec it was computed from (kept while the next one computes).
  const [shown, setShown] = useState<{ spec: CoilSpec; sheet: EngineSheet } | null>(null);
  useEffect(() => {
    if (calc.data && !calc.isPlaceholderData && settled) setShown({ spec: settled, sheet: calc.data });
  }, [calc.data, calc.isPlaceholderData, settled]);
  const calculating = spec !== null && (waiting || calc.isFetching);

  const serverErrors = isApiError(calc.error) ? calc.error.fields : {};
  const messages = messagesByField({ ...serverErrors, ...localErrors });

  const onChange = useCallback((change: Partial<DraftValues>) => {
    setNotice(null);
    // An overall diameter from a spool's data sheet holds for one wire size only.
    if ('standard' in change || 'gauge' in change || 'diameterMm' in change || 'conductor' in change || 'insulationGrade' in change) {
      setExtras((x) => (x.overallDiameter === undefined ? x : { ...x, overallDiameter: undefined }));
    }
    // An older sheet's bare fill factor gives way to a packing typed now, or to another pattern.
    if ('pattern' in change || 'packing' in change) setExtras((x) => (x.fillFactor === undefined ? x : { ...x, fillFactor: undefined }));
    setValues((v) => ({ ...v, ...change }));
  }, []);
  const adopt = useCallback(
    (size: WireSizeValue) => {
      onChange(wireValues(size));
      setNotice(`Adopted ${wireSizeLabel(size)}.`);
    },
    [onChange],
  );

  // Find wire: the solver against the line's target, with the choices made so far.
  const solve = useSolve();
  const target = line.starting.target;

  // Saving and the sheet's state.
  const save = useSaveDraft(line.id);
  const newest: BuildSheetRecord | undefined = line.sheets[0];
  const unsaved = spec !== null && (!newest || canonical(newest.spec) !== canonical(spec));
  const releasedSheet = line.sheets.find((s) => s.status === 'released') ?? null;
  const workOrders = useQuery({ ...lineWorkOrdersQuery(line.id), enabled: releasedSheet !== null && released === null });
  const saveErrors = isApiError(save.error) ? messagesByField(save.error.fields) : null;

  const onSave = () => {
    if (!spec) return;
    save.mutate(
      { spec, target, notes: '' },
      {
        onSuccess: (rec) => {
          setNotice(`Saved as version ${rec.version} (draft).`);
          save.reset();
        },
      },
    );
  };

  const load = (s: BuildSheetRecord) => {
    fill(s.spec, prefs);
    setNotice(`Version ${s.version} loaded into the form.`);
  };

  // A saved version shown unchanged is a record: its numbers as they were computed, by the engine
  // that computed them (never recomputed). Anything else is the live calculation.
  const reference = useQuery(referenceQuery);
  const currentEngine = reference.data?.engineVersion;
  const record = useMemo(() => {
    if (unsaved || !newest) return null;
    const parsed = engineSheet.safeParse(newest.result);
    return parsed.success ? parsed.data : null;
  }, [unsaved, newest]);
  const sheet = record ?? shown?.sheet ?? null;
  /** The newest version was computed by an earlier engine: saving the same choices recomputes it. */
  const olderEngine = !unsaved && !!newest && !!currentEngine && newest.engineVersion !== currentEngine;
  const sheetSpec = record && newest ? newest.spec : (shown?.spec ?? null);

  return (
    <div className="flex flex-col gap-5">
      <PageHeader
        title={
          <>
            {line.order.number} · line {line.lineNo}: {line.title}
          </>
        }
        lead={
          <>
            {line.customer.name} · PO {line.order.purchaseOrder} · {line.quantity} units due {formatDay(line.order.dueDate)}
            {newest && (
              <span className="ml-2 inline-block align-middle">
                <SheetStatusBadge status={newest.status} /> <span className="text-sm">version {newest.version}</span>
              </span>
            )}
          </>
        }
        actions={
          <Link to="/engineering" className="text-sm font-semibold text-copper-700 hover:underline">
            ← Engineering queue
          </Link>
        }
      />

      <div className="grid items-start gap-5 lg:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <div className="flex flex-col gap-5">
          <Panel title="Customer’s requirement">
            <RequirementView line={line} u={u} />
          </Panel>
          <Panel
            title="Drafting"
            actions={
              <Button
                size="sm"
                onClick={() => {
                  fill(line.starting.spec, prefs);
                  setNotice('Form reset to the requirement.');
                }}
              >
                Reset to requirement
              </Button>
            }
          >
            <DraftForm
              values={values}
              onChange={onChange}
              errors={messages.fields}
              u={u}
              requirementHasCircuit={line.requirement.magneticCircuit !== undefined}
              coreMaterials={reference.data?.coreMaterials}
            />
            {messages.other.length > 0 && (
              <div className="mt-3">
                <Alert kind="fault" title="The engine refuses these choices">
                  <ul className="list-disc pl-4">
                    {messages.other.map((m) => (
                      <li key={m}>{m}</li>
                    ))}
                  </ul>
                </Alert>
              </div>
            )}
            <div className="mt-4 flex flex-wrap items-center gap-2 border-t border-graphite-200 pt-3">
              <Button
                variant="secondary"
                onClick={() => spec && target && solve.mutate({ spec, target })}
                disabled={!spec || !target}
                busy={solve.isPending}
                title={!target ? 'The requirement cannot be stated as a solver target' : undefined}
              >
                Find wire
              </Button>
              <span className="text-sm text-graphite-600">{target ? `Target: ${describeTarget(target)}` : 'No solver target for this requirement.'}</span>
            </div>
          </Panel>
        </div>

        <div className="flex flex-col gap-5">
          <Panel
            title={<>Build sheet {unsaved ? '(not saved)' : newest ? `version ${newest.version}` : ''}</>}
            actions={
              <span role="status" aria-live="polite" className={`flex items-center gap-1.5 text-sm ${calculating ? 'text-graphite-600' : 'text-transparent'}`} data-testid="calculating">
                {calculating && <span aria-hidden className="size-3 animate-spin rounded-full border-2 border-copper-500 border-r-transparent" />}
                {calculating ? 'calculating…' : 'up to date'}
              </span>
            }
          >
            {notice && (
              <div className="mb-3">
                <Alert kind="good" title={notice} />
              </div>
            )}
            {calc.isError && !(isApiError(calc.error) && Object.keys(calc.error.fields).length > 0) && (
              <Alert kind="fault" title="The calculation did not run">{errorMessage(calc.error)}</Alert>
            )}
            {record && newest && (
              <div className="mb-3 flex flex-col gap-2 text-sm" data-testid="sheet-record">
                <p className="text-graphite-700">
                  Version {newest.version} as computed by engine {newest.engineVersion} on {formatDay(newest.draftedAt)} — a record, never recomputed.
                  {currentEngine && currentEngine !== newest.engineVersion && ` The current engine (${currentEngine}) computes a new version afresh.`}
                </p>
                {newest.changes && <SheetChangesNote changes={newest.changes} u={u} />}
              </div>
            )}
            {!sheet || !sheetSpec ? (
              spec ? <Loading what="Calculating" /> : <p className="text-graphite-600">Correct the marked fields to calculate.</p>
            ) : (
              <div className={`transition-opacity ${calculating && !record ? 'opacity-70' : ''}`}>
                <SheetView sheet={sheet} spec={sheetSpec} tolerancePercent={line.tolerancePercent} u={u} />
              </div>
            )}
            {writer && (
              <div className="mt-4 flex flex-col gap-2 border-t border-graphite-200 pt-3">
                {saveErrors && (
                  <Alert kind="fault" title={errorMessage(save.error)}>
                    {[...Object.values(saveErrors.fields), ...saveErrors.other].join(' · ')}
                  </Alert>
                )}
                {save.isError && !saveErrors && <Alert kind="fault" title="Not saved">{errorMessage(save.error)}</Alert>}
                <div className="flex flex-wrap items-center gap-2">
                  <Button
                    variant={unsaved || olderEngine ? 'primary' : 'secondary'}
                    onClick={onSave}
                    disabled={!spec || !(unsaved || olderEngine) || calculating || !line.can.draft}
                    busy={save.isPending}
                  >
                    Save as draft version {(line.sheets[0]?.version ?? 0) + 1}
                  </Button>
                  <span className="text-sm text-graphite-600">
                    {!line.can.draft
                      ? 'This order no longer takes new versions.'
                      : unsaved
                        ? 'The form differs from every saved version’s newest.'
                        : olderEngine
                          ? `Version ${newest?.version} was computed by engine ${newest?.engineVersion}: save it again to compute it with engine ${currentEngine} and see what changes.`
                          : `Version ${newest?.version} is what the form shows.`}
                  </span>
                </div>
              </div>
            )}
          </Panel>

          {writer && newest && (
            <SheetStage
              line={line}
              newest={newest}
              unsaved={unsaved}
              released={released}
              setReleased={(r) => {
                setNotice(null);
                setReleased(r);
              }}
              onApproved={(v) => setNotice(`Version ${v} approved.`)}
            />
          )}
          {(released || (releasedSheet && workOrders.data)) && (
            <Panel title="Work orders">
              {released ? (
                <WorkOrdersCreated result={released} />
              ) : (
                <ul className="text-sm" data-testid="work-orders">
                  {workOrders.data?.map((w) => (
                    <li key={w.id} data-work-order={w.number}>
                      <strong>{w.number}</strong> · {w.quantity} units · due {formatDay(w.dueDate)} · {STAGE_LABELS[w.stage]}
                    </li>
                  ))}
                </ul>
              )}
            </Panel>
          )}
        </div>
      </div>

      {(solve.data || solve.error) && (
        <Panel title="Find wire: sizes that meet the target">
          <FindWireResults result={solve.data} error={solve.error} onAdopt={adopt} u={u} />
        </Panel>
      )}

      {sheet && sheetSpec && <Pictures sheet={sheet} spec={sheetSpec} profile={profile.data} profileError={profile.error} u={u} />}

      <Panel title="Every wire size for these choices">
        {sweep.isError ? (
          <Alert kind="fault" title="The sweep did not run">{errorMessage(sweep.error)}</Alert>
        ) : !sweep.data ? (
          <Loading what="Sweeping the wire sizes" />
        ) : (
          <SweepTable rows={sweep.data} insulationClass={shown?.spec.insulationClass ?? 155} current={spec?.wire ?? null} onAdopt={adopt} u={u} />
        )}
        <p className="mt-2 text-sm text-graphite-600">
          Click a row to adopt its size. Low: ampere-turns (or pull) at the low corner, where the target must be met. High: the winding at the high corner, or the
          duty cycle’s peak when hotter. Margin: the class less its hot-spot allowance, less that. Sizes that give no winding on this bobbin are left out.
        </p>
      </Panel>

      {sheet && <AssumptionsPanel sheet={sheet} engineVersion={newest && !unsaved ? newest.engineVersion : undefined} u={u} />}

      <Panel title="Versions">
        <VersionHistory sheets={line.sheets} selectedId={unsaved ? null : (newest?.id ?? null)} onSelect={load} />
      </Panel>
    </div>
  );
}

/** The newest saved version's next step: approve a draft, release an approved sheet. */
function SheetStage({
  line,
  newest,
  unsaved,
  released,
  setReleased,
  onApproved,
}: {
  line: OrderLineDetail;
  newest: BuildSheetRecord;
  unsaved: boolean;
  released: ReleaseResponse | null;
  setReleased: (r: ReleaseResponse) => void;
  onApproved: (version: number) => void;
}) {
  if (newest.status === 'released' || newest.status === 'superseded' || released) return null;
  const note = unsaved ? (
    <p className="mb-2 text-sm text-caution">The form has changes that are not in version {newest.version}; what follows acts on version {newest.version} as saved.</p>
  ) : null;
  if (newest.status === 'draft') {
    return (
      <Panel title={`Approve version ${newest.version}`}>
        {note}
        <ApprovePanel sheet={newest} lineId={line.id} onApproved={onApproved} />
      </Panel>
    );
  }
  return (
    <Panel title={`Release version ${newest.version}`}>
      {note}
      {!newest.can.release && <p className="mb-2 text-sm text-graphite-600">The order must be acknowledged before its lines go to the floor.</p>}
      <ReleasePanel sheet={newest} lineId={line.id} onReleased={setReleased} />
    </Panel>
  );
}

function Pictures({ sheet, spec, profile, profileError, u }: { sheet: EngineSheet; spec: CoilSpec; profile: import('../../contracts/coil').CoilProfileResponse | undefined; profileError: unknown; u: UnitFormatters }) {
  const m = spec.magneticCircuit;
  return (
    <Panel title="Pictures">
      <div className="grid gap-6 xl:grid-cols-2">
        <CrossSection
          u={u}
          g={{
            innerDiameter: spec.bobbin.innerDiameter,
            builtDiameter: sheet.outerDiameter,
            limitDiameter: spec.bobbin.outerDiameter,
            length: spec.bobbin.length,
            layers: sheet.layers,
            turnsPerLayer: sheet.turnsPerLayer,
            turns: sheet.turns,
            wireDiameter: sheet.wire.overallDiameter,
          }}
        />
        {profileError ? (
          <Alert kind="fault" title="The curves did not compute">{errorMessage(profileError)}</Alert>
        ) : !profile ? (
          <Loading what="Computing the curves" />
        ) : (
          <>
            <WarmUpPlot warmUp={profile.warmUp} insulationClass={spec.insulationClass} steady={sheet.windingTemperature} u={u} />
            <FieldPlot field={profile.field} windingLength={sheet.windingLength} u={u} />
            {profile.pull && m && <PullPlot pull={profile.pull} designGap={m.airGap} u={u} />}
            {profile.bh && <BHPlot bh={profile.bh} u={u} />}
          </>
        )}
      </div>
    </Panel>
  );
}
