import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { useForm } from 'react-hook-form';
import { ROLE_LABELS, STAFF_ROLES } from '../../contracts/roles';
import { issueTokenRequest, type ApiTokenRecord, type IssueTokenRequest } from '../../contracts/tokens';
import { Alert, FormProblems } from '../../components/Alert';
import { Button } from '../../components/Button';
import { DataTable } from '../../components/DataTable';
import { SelectField, TextField } from '../../components/Field';
import { Loading, PageHeader, Panel } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { errorMessage } from '../../lib/api';
import { formatDateTime } from '../../lib/format';
import { applyServerErrors } from '../../lib/forms';
import { openApiQuery, tokensQuery, useIssueToken, useRevokeToken, type OpenApiDocument, type OpenApiOperation } from './api';
import { schemaRows, type SchemaRow } from './schemaRows';

const tokenCol = createColumnHelper<ApiTokenRecord>();

function TokensPanel() {
  const tokens = useQuery(tokensQuery);
  const issue = useIssueToken();
  const revoke = useRevokeToken();
  const [secret, setSecret] = useState<{ name: string; value: string } | null>(null);
  const [copied, setCopied] = useState(false);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<IssueTokenRequest>({ resolver: zodResolver(issueTokenRequest), defaultValues: { name: '', role: 'office' } });

  const onSubmit = handleSubmit(async (values) => {
    try {
      const r = await issue.mutateAsync(values);
      setSecret({ name: r.token.name, value: r.secret });
      setCopied(false);
      reset();
    } catch (e) {
      applyServerErrors(e, setError, ['name', 'role']);
    }
  });

  const columns = useMemo(
    () => [
      tokenCol.accessor('name', { header: 'For' }),
      tokenCol.accessor((t) => ROLE_LABELS[t.role], { id: 'role', header: 'Acts as', meta: { filter: 'select' } }),
      tokenCol.accessor('prefix', { header: 'Starts with', cell: (c) => <code className="font-mono text-sm">{c.getValue()}…</code> }),
      tokenCol.accessor((t) => t.issuedBy.name, { id: 'issuedBy', header: 'Issued by' }),
      tokenCol.accessor('createdAt', { header: 'Issued', cell: (c) => formatDateTime(c.getValue()) }),
      tokenCol.accessor('lastUsedAt', { header: 'Last used', cell: (c) => formatDateTime(c.getValue(), 'never') }),
      tokenCol.accessor((t) => (t.revokedAt ? 'Revoked' : 'Active'), {
        id: 'state',
        header: 'State',
        meta: { filter: 'select' },
        cell: (c) => <StatusBadge kind={c.row.original.revokedAt ? 'idle' : 'good'}>{c.getValue()}</StatusBadge>,
      }),
      tokenCol.display({
        id: 'actions',
        header: '',
        cell: (c) =>
          c.row.original.revokedAt ? null : (
            <Button
              size="sm"
              variant="danger"
              busy={revoke.isPending && revoke.variables === c.row.original.id}
              onClick={() => {
                if (window.confirm(`Revoke the token for “${c.row.original.name}”? Whatever uses it stops working at once.`)) revoke.mutate(c.row.original.id);
              }}
            >
              Revoke
            </Button>
          ),
      }),
    ],
    [revoke],
  );

  return (
    <Panel title="API tokens">
      <p className="mb-3 text-graphite-700">
        A token lets another system (an ERP, a label-printer script, a customer’s purchasing system) call the API in one role, without a password. It acts on your behalf: records it
        makes name you. Only a fingerprint of it is kept, so it is shown once — copy it into the other system straight away. Revoke it when that system no longer needs it.
      </p>
      <form className="flex flex-wrap items-end gap-3" onSubmit={onSubmit} noValidate>
        <TextField label="What it is for" wrapperClassName="min-w-64" placeholder="e.g. ERP order feed" error={errors.name?.message} {...register('name')} />
        <SelectField label="Acts as" error={errors.role?.message} {...register('role')}>
          {STAFF_ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABELS[r]}
            </option>
          ))}
        </SelectField>
        <Button type="submit" variant="primary" busy={issue.isPending}>
          Issue a token
        </Button>
      </form>
      {issue.error && !Object.keys(errors).length && (
        <div className="mt-3">
          <FormProblems messages={applyServerErrors(issue.error, () => {}, [])} />
        </div>
      )}
      {secret && (
        <div className="mt-4 rounded-md border-2 border-copper-500 bg-copper-50 p-3" data-token-secret>
          <p className="font-semibold text-graphite-900">The token for “{secret.name}” — shown this once</p>
          <div className="mt-2 flex flex-wrap items-center gap-2">
            <code className="break-all rounded bg-white px-2 py-1 font-mono text-sm text-graphite-950">{secret.value}</code>
            <Button
              size="sm"
              onClick={() => {
                void navigator.clipboard?.writeText(secret.value).then(() => setCopied(true));
              }}
            >
              {copied ? 'Copied' : 'Copy'}
            </Button>
            <Button size="sm" variant="quiet" onClick={() => setSecret(null)}>
              I have stored it
            </Button>
          </div>
          <p className="mt-2 text-sm text-graphite-700">
            Send it as <code className="font-mono">Authorization: Bearer {secret.value.slice(0, 10)}…</code> with every request.
          </p>
        </div>
      )}
      <div className="mt-4">
        {tokens.isPending ? (
          <Loading what="Loading tokens" />
        ) : tokens.error ? (
          <Alert title="Cannot load the tokens">{errorMessage(tokens.error)}</Alert>
        ) : (
          <DataTable
            data={tokens.data}
            columns={columns}
            noun="token"
            csvName="api-tokens"
            getRowId={(t) => String(t.id)}
            empty={<p className="p-4 text-graphite-600">No tokens yet. Issue one above when another system needs to call the API.</p>}
          />
        )}
      </div>
    </Panel>
  );
}

const METHOD_TONE: Record<string, string> = {
  get: 'bg-graphite-100 text-graphite-800 border-graphite-300',
  post: 'bg-copper-50 text-copper-800 border-copper-300',
  patch: 'bg-caution-soft text-caution border-caution/40',
  delete: 'bg-fault-soft text-fault border-fault/40',
};

function FieldTable({ rows, caption }: { rows: SchemaRow[]; caption: string }) {
  if (!rows.length) return null;
  return (
    <table className="mt-2 w-full border-collapse text-sm">
      <caption className="mb-1 text-left font-semibold text-graphite-800">{caption}</caption>
      <thead>
        <tr className="border-b border-graphite-200 text-left text-graphite-600">
          <th className="py-1 pr-3 font-semibold">Field</th>
          <th className="py-1 pr-3 font-semibold">Type</th>
          <th className="py-1 pr-3 font-semibold">Needed</th>
          <th className="py-1 font-semibold">Rules</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.name + r.type} className="border-b border-graphite-100 align-top">
            <td className="py-1 pr-3 font-mono text-graphite-900">{r.name}</td>
            <td className="py-1 pr-3 font-mono text-graphite-700">{r.type}</td>
            <td className="py-1 pr-3">{r.required ? 'yes' : 'no'}</td>
            <td className="py-1 text-graphite-700">{[r.rules, r.description].filter(Boolean).join(' — ')}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

type Entry = { method: string; path: string; op: OpenApiOperation };

function OperationDetails({ e, server }: { e: Entry; server: string }) {
  const body = e.op.requestBody?.content;
  const bodySchema = body?.['application/json']?.schema ?? body?.['multipart/form-data']?.schema;
  const ok = Object.entries(e.op.responses).find(([s]) => s.startsWith('2'));
  const answerMedia = ok?.[1].content ? Object.keys(ok[1].content)[0] : undefined;
  const params = (e.op.parameters ?? []).filter((p) => p.in !== 'header');
  const example = `curl${e.method === 'get' ? '' : ` -X ${e.method.toUpperCase()}`} -H "Authorization: Bearer $SPOOLWRIGHT_TOKEN"${
    body?.['application/json'] ? ` -H "Content-Type: application/json" -d '{…}'` : body ? ' -F file=@rows.csv' : ''
  } ${server}${e.path.replace(/^\/api/, '/api')}`;
  return (
    <div className="space-y-3 border-t border-graphite-200 px-3 pb-3 pt-2">
      {e.op.description && <p className="whitespace-pre-line text-sm text-graphite-700">{e.op.description}</p>}
      {params.length > 0 && (
        <FieldTable caption="Parameters" rows={params.map((p) => ({ name: `${p.name} (${p.in})`, type: String(p.schema?.type ?? 'string'), required: Boolean(p.required), rules: '', description: p.description ?? '' }))} />
      )}
      {bodySchema && <FieldTable caption={body?.['multipart/form-data'] ? 'Form fields (multipart)' : 'Request body (JSON)'} rows={schemaRows(bodySchema)} />}
      {ok && (
        <div className="text-sm">
          <p className="font-semibold text-graphite-800">
            Answer: {ok[0]} {answerMedia && answerMedia !== 'application/json' ? `(${answerMedia})` : ''}
          </p>
          {answerMedia === 'application/json' && <FieldTable caption="Answer fields" rows={schemaRows(ok[1].content?.['application/json']?.schema, 2)} />}
        </div>
      )}
      <p className="text-sm text-graphite-600">
        Errors: {Object.keys(e.op.responses).filter((s) => !s.startsWith('2')).join(', ')} with <code className="font-mono">{'{ error: { code, message, fields? } }'}</code>
      </p>
      <pre className="overflow-x-auto rounded bg-graphite-900 p-2 text-xs text-graphite-100">{example}</pre>
    </div>
  );
}

function Reference({ doc }: { doc: OpenApiDocument }) {
  const [filter, setFilter] = useState('');
  const server = doc.servers?.[0]?.url ?? window.location.origin;
  const byTag = useMemo(() => {
    const entries: Entry[] = Object.entries(doc.paths).flatMap(([path, ops]) => Object.entries(ops).map(([method, op]) => ({ method, path, op })));
    const q = filter.trim().toLowerCase();
    const shown = q ? entries.filter((e) => `${e.method} ${e.path} ${e.op.summary} ${e.op.tags?.join(' ')} ${(e.op['x-roles'] ?? []).join(' ')}`.toLowerCase().includes(q)) : entries;
    const groups = new Map<string, Entry[]>();
    for (const e of shown) {
      const tag = e.op.tags?.[0] ?? 'Other';
      groups.set(tag, [...(groups.get(tag) ?? []), e]);
    }
    return [...groups.entries()];
  }, [doc, filter]);
  const count = byTag.reduce((n, [, es]) => n + es.length, 0);

  return (
    <Panel
      title={`Routes (${count})`}
      actions={
        <a className="text-sm text-copper-700 underline" href="/api/openapi.json" target="_blank" rel="noreferrer">
          The OpenAPI 3.1 document (JSON)
        </a>
      }
    >
      <p className="mb-3 text-graphite-700">{doc.info.description}</p>
      <TextField label="Find a route" placeholder="path, word or role, e.g. orders, spool, Shipping" value={filter} onChange={(e) => setFilter(e.target.value)} wrapperClassName="max-w-md" />
      <div className="mt-4 space-y-5">
        {byTag.map(([tag, entries]) => (
          <section key={tag} aria-label={tag}>
            <h3 className="mb-1.5 text-sm font-bold uppercase tracking-wide text-graphite-600">{tag}</h3>
            <ul className="divide-y divide-graphite-100 rounded-md border border-graphite-200">
              {entries.map((e) => (
                <li key={`${e.method} ${e.path}`}>
                  <details>
                    <summary className="flex cursor-pointer flex-wrap items-center gap-x-3 gap-y-1 px-3 py-2 hover:bg-graphite-50">
                      <span className={`w-16 rounded border px-1.5 py-0.5 text-center font-mono text-xs font-bold uppercase ${METHOD_TONE[e.method] ?? METHOD_TONE.get}`}>{e.method}</span>
                      <code className="font-mono text-sm text-graphite-950">{e.path}</code>
                      <span className="text-sm text-graphite-700">{e.op.summary}</span>
                      <span className="ml-auto text-xs text-graphite-500">{(e.op['x-roles'] ?? []).length ? (e.op['x-roles'] ?? []).map((r) => ROLE_LABELS[r as keyof typeof ROLE_LABELS] ?? r).join(', ') : 'anyone'}</span>
                    </summary>
                    <OperationDetails e={e} server={server} />
                  </details>
                </li>
              ))}
            </ul>
          </section>
        ))}
      </div>
    </Panel>
  );
}

/** For admins: the API's routes in readable form, and the tokens other systems call it with. */
export function IntegrationsPage() {
  const doc = useQuery(openApiQuery);
  return (
    <div className="space-y-6" data-integrations>
      <PageHeader
        title="API and tokens"
        lead="Everything the screens do goes through this API. Other systems call it with a token; every route below says who may use it, what it takes and what it answers (SI units)."
      />
      <TokensPanel />
      {doc.isPending ? <Loading what="Loading the API description" /> : doc.error ? <Alert title="Cannot load the API description">{errorMessage(doc.error)}</Alert> : <Reference doc={doc.data} />}
    </div>
  );
}
