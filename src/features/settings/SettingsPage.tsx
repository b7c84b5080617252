import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { useForm, type Path } from 'react-hook-form';
import { z } from 'zod';
import { STAGE_LABELS } from '../../contracts/stages';
import { PAPER_SIZES, shopSettings, STANDARD_TIMED_STAGES, type ShopSettingsRecord } from '../../contracts/settings';
import { Alert } from '../../components/Alert';
import { Button } from '../../components/Button';
import { SelectField, TextField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { api, errorMessage } from '../../lib/api';
import { applyServerErrors } from '../../lib/forms';
import { queryClient } from '../../lib/queryClient';

const settingsResponse = z.object({ settings: shopSettings });
const settingsQuery = { queryKey: ['settings'], queryFn: async ({ signal }: { signal: AbortSignal }) => (await api.get('/settings', { schema: settingsResponse, signal })).settings };

const FIELDS: Path<ShopSettingsRecord>[] = [
  'name',
  'paper',
  'replyTo',
  'unitsPerWorkOrder',
  'scrapAllowancePercent',
  'shiftHoursPerDay',
  'defaultSpindleRpm',
  'defaultSetupSeconds',
  'defaultHeatTransferCoefficient',
  ...STANDARD_TIMED_STAGES.flatMap((s) => [`stageStandardTimes.${s}.minutesPerUnit`, `stageStandardTimes.${s}.minutesPerBatch`] as Path<ShopSettingsRecord>[]),
];

function SettingsForm({ current }: { current: ShopSettingsRecord }) {
  const [notice, setNotice] = useState<string[] | null>(null);
  const form = useForm<ShopSettingsRecord>({ resolver: zodResolver(shopSettings), defaultValues: current });
  const { register, handleSubmit, formState, setError } = form;
  const e = formState.errors;
  const save = useMutation({
    mutationFn: (values: ShopSettingsRecord) => api.patch('/settings', values, { schema: settingsResponse }),
    onSuccess: (r) => {
      queryClient.setQueryData(settingsQuery.queryKey, r.settings);
      form.reset(r.settings);
      setNotice([]);
    },
    onError: (err) => setNotice(applyServerErrors(err, setError, FIELDS)),
  });
  const num = { valueAsNumber: true } as const;
  return (
    <form className="space-y-5" onSubmit={handleSubmit((v) => save.mutate(v))} noValidate>
      {notice && notice.length === 0 && <Alert kind="good" title="Settings saved" />}
      {notice && notice.length > 0 && <Alert title="Not saved">{notice.join(' ')}</Alert>}
      <Panel title="The shop">
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Shop name (on travelers and e-mail)" error={e.name?.message} {...register('name')} />
          <SelectField label="Paper for travelers" error={e.paper?.message} {...register('paper')}>
            {PAPER_SIZES.map((p) => (
              <option key={p} value={p}>
                {p === 'A4' ? 'A4 (210 × 297 mm)' : 'Letter (8.5 × 11 in)'}
              </option>
            ))}
          </SelectField>
          <TextField label="Reply-to address for customer e-mail" type="email" error={e.replyTo?.message} {...register('replyTo')} />
        </div>
      </Panel>
      <Panel title="Releasing build sheets">
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Units per work order" type="number" min={1} step={1} error={e.unitsPerWorkOrder?.message} {...register('unitsPerWorkOrder', num)} />
          <TextField label="Wire scrap allowance (%)" type="number" min={0} step={0.5} error={e.scrapAllowancePercent?.message} {...register('scrapAllowancePercent', num)} />
          <TextField
            label="Heat-transfer coefficient for new sheets, W/(m²·K)"
            type="number"
            step={0.1}
            min={0}
            placeholder="the engine’s default"
            hint="Empty: the engine’s still-air default. Engineers adopt the shop’s measured value from Design feedback; sheets already drafted keep theirs."
            error={e.defaultHeatTransferCoefficient?.message}
            {...register('defaultHeatTransferCoefficient', { setValueAs: (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v)) })}
          />
        </div>
      </Panel>
      <Panel title="Floor estimates">
        <div className="grid gap-4 sm:grid-cols-3">
          <TextField label="Working hours per day (h)" type="number" step={0.25} error={e.shiftHoursPerDay?.message} {...register('shiftHoursPerDay', num)} />
          <TextField label="Spindle speed without a station (rev/min)" type="number" error={e.defaultSpindleRpm?.message} {...register('defaultSpindleRpm', num)} />
          <TextField label="Winding set-up without a station (s)" type="number" error={e.defaultSetupSeconds?.message} {...register('defaultSetupSeconds', num)} />
        </div>
        <table className="mt-4 w-full max-w-2xl text-sm">
          <caption className="mb-1 text-left text-graphite-600">Standard time of each stage (winding is computed from turns, spindle speed and set-up)</caption>
          <thead>
            <tr className="text-left text-xs text-graphite-500 uppercase">
              <th className="py-1 font-semibold">Stage</th>
              <th className="py-1 font-semibold">Minutes per unit</th>
              <th className="py-1 font-semibold">Minutes per work order</th>
            </tr>
          </thead>
          <tbody>
            {STANDARD_TIMED_STAGES.map((s) => (
              <tr key={s} className="border-t border-graphite-100">
                <td className="py-1.5 pr-3 font-semibold">{STAGE_LABELS[s]}</td>
                <td className="py-1.5 pr-3">
                  <TextField label={`${STAGE_LABELS[s]}: minutes per unit`} type="number" step={0.1} min={0} error={e.stageStandardTimes?.[s]?.minutesPerUnit?.message} {...register(`stageStandardTimes.${s}.minutesPerUnit`, num)} />
                </td>
                <td className="py-1.5">
                  <TextField label={`${STAGE_LABELS[s]}: minutes per work order`} type="number" step={1} min={0} error={e.stageStandardTimes?.[s]?.minutesPerBatch?.message} {...register(`stageStandardTimes.${s}.minutesPerBatch`, num)} />
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Panel>
      <Button type="submit" variant="primary" busy={save.isPending} disabled={!formState.isDirty}>
        Save settings
      </Button>
    </form>
  );
}

/** Shop constants (admin): name and paper for travelers, release batch size, floor estimates. */
export function SettingsPage() {
  const q = useQuery(settingsQuery);
  return (
    <div className="space-y-5">
      <PageHeader title="Shop settings" lead="Constants the whole shop works with. Changes apply to what is released, printed or estimated from now on; records already made keep the values they were made with." />
      {q.isPending ? <Loading what="Loading the settings" /> : q.error ? <Alert title="Cannot load the settings">{errorMessage(q.error)}</Alert> : <SettingsForm current={q.data} />}
    </div>
  );
}
