import { useInfiniteQuery } from '@tanstack/react-query';
import { createColumnHelper } from '@tanstack/react-table';
import { Link, useSearchParams } from 'react-router-dom';
import { ROLE_LABELS, type Role } from '@shared/roles';
import { Button, DataTable, ErrorState, PageHeader, SelectField } from '@/components/ui';
import { formatCount, formatDateTime } from '@shared/format';
import { paths } from '@/config/paths';
import { adminQueries, type AuditEntry } from '../api/admin-queries';
import { usePageTitle } from '@/lib/page-title';

/** Kinds of change the log can be narrowed to, by the first part of the action ("run.upload" → run). */
const ACTION_TYPES = [
  { value: '', label: 'All changes', prefixes: [] },
  { value: 'runs', label: 'Runs and run files', prefixes: ['run', 'column-layout'] },
  { value: 'sessions', label: 'Dyno sessions', prefixes: ['session'] },
  { value: 'stages', label: 'Stages and parts', prefixes: ['stage', 'part'] },
  { value: 'customers', label: 'Customers', prefixes: ['customer'] },
  { value: 'bikes', label: 'Bikes', prefixes: ['bike'] },
  { value: 'comparisons', label: 'Comparisons', prefixes: ['comparison'] },
  { value: 'reports', label: 'Reports and share links', prefixes: ['report'] },
  { value: 'users', label: 'Users and roles', prefixes: ['user'] },
  { value: 'settings', label: 'Shop settings and dynos', prefixes: ['shop', 'dyno'] },
] as const;

const str = (v: unknown) => (typeof v === 'string' && v ? v : null);
const roleName = (r: unknown) => (typeof r === 'string' && r in ROLE_LABELS ? ROLE_LABELS[r as Role].toLowerCase() : String(r));
const quoted = (v: unknown) => (str(v) ? ` “${str(v)}”` : '');

interface Sentence {
  text: string;
  /** The thing acted on, linked when it has a page. */
  link?: { label: string; to: string };
  after?: string;
}

/** One plain sentence per entry: "Uploaded run file pull-03.csv", "Changed role of Sam from front desk to owner". */
function describeEntry(e: AuditEntry): Sentence {
  const d = e.details ?? {};
  const id = e.entityId;
  switch (e.action) {
    case 'run.upload':
      return { text: 'Uploaded run file ', link: { label: str(d.file) ?? 'a run file', to: paths.run(id) } };
    case 'run.update':
      return { text: 'Edited ', link: { label: 'a run', to: paths.run(id) } };
    case 'run.delete':
      return { text: `Moved run file${quoted(d.originalName)} to the bin` };
    case 'run.restore':
      return { text: 'Restored run file ', link: { label: str(d.originalName) ?? 'a run', to: paths.run(id) } };
    case 'run.mapping':
      return { text: 'Set which columns to read in ', link: { label: 'a run file', to: paths.run(id) } };
    case 'run.reprocess':
      return { text: 'Read again with the current analysis: ', link: { label: 'a run file', to: paths.run(id) } };
    case 'column-layout.create':
    case 'column-layout.update':
      return { text: `Saved the column layout${quoted(d.name)}` };
    case 'column-layout.delete':
      return { text: `Removed the column layout${quoted(d.name)}` };
    case 'session.create':
      return { text: 'Started ', link: { label: 'a dyno session', to: paths.session(id) } };
    case 'session.update':
      return { text: 'Edited ', link: { label: 'a dyno session', to: paths.session(id) } };
    case 'session.safety-check':
      return { text: 'Confirmed the safety checks of ', link: { label: 'a dyno session', to: paths.session(id) } };
    case 'stage.create':
      return str(d.bikeId) ? { text: `Added stage${quoted(d.name)} to `, link: { label: 'a bike', to: paths.bike(str(d.bikeId)!) } } : { text: `Added stage${quoted(d.name)}` };
    case 'stage.update':
      return { text: `Edited stage${quoted(d.name)}` };
    case 'stage.delete':
      return str(d.bikeId) ? { text: `Removed stage${quoted(d.name)} from `, link: { label: 'a bike', to: paths.bike(str(d.bikeId)!) } } : { text: `Removed stage${quoted(d.name)}` };
    case 'stage.reorder':
      return { text: 'Put the stages of ', link: { label: 'a bike', to: paths.bike(id) }, after: ' in a new order' };
    case 'stage.reference-run':
      return str(d.runId) ? { text: 'Chose ', link: { label: 'the reference run', to: paths.run(str(d.runId)!) }, after: ' of a stage' } : { text: 'Cleared the reference run of a stage' };
    case 'part.create':
      return { text: 'Added a part to a stage' };
    case 'part.update':
      return { text: 'Edited a part of a stage' };
    case 'part.delete':
      return { text: `Removed the part${quoted(d.description)}` };
    case 'customer.create':
      return { text: 'Added customer ', link: { label: str(d.name) ?? 'a customer', to: paths.customer(id) } };
    case 'customer.update':
      return { text: 'Edited customer ', link: { label: str(d.name) ?? 'details', to: paths.customer(id) } };
    case 'customer.delete':
      return { text: `Removed customer${quoted(d.name)}` };
    case 'bike.create':
      return { text: 'Added bike ', link: { label: [str(d.make), str(d.model)].filter(Boolean).join(' ') || 'a bike', to: paths.bike(id) } };
    case 'bike.update':
      return { text: 'Edited bike ', link: { label: [str(d.make), str(d.model)].filter(Boolean).join(' ') || 'details', to: paths.bike(id) } };
    case 'comparison.create':
      return { text: 'Saved comparison ', link: { label: str(d.name) ?? 'a comparison', to: paths.comparison(id) } };
    case 'comparison.delete':
      return { text: `Removed comparison${quoted(d.name)}` };
    case 'report.create':
      return { text: 'Made ', link: { label: `gain report ${d.number ?? ''}${d.version ? ` (version ${d.version})` : ''}`.replace(/ +/g, ' ').trim(), to: paths.report(id) } };
    case 'report.share':
      return { text: 'Made a share link for ', link: { label: 'a gain report', to: paths.report(id) } };
    case 'report.unshare':
      return { text: 'Turned off a share link of ', link: { label: 'a gain report', to: paths.report(id) } };
    case 'report.send':
      return { text: 'E-mailed ', link: { label: 'a gain report', to: paths.report(id) }, after: str(d.to) ? ` to ${str(d.to)}` : '' };
    case 'user.invite':
      return { text: `Invited ${str(d.email) ?? 'a user'}${d.role ? ` as ${roleName(d.role)}` : ''}` };
    case 'user.resend-invite':
      return { text: `Sent a fresh invitation to ${str(d.email) ?? 'a user'}` };
    case 'user.update':
      return { text: describeUserChange(d) };
    case 'shop.update':
      return { text: 'Changed ', link: { label: 'the shop settings', to: paths.shopSettings } };
    case 'shop.logo':
      return { text: 'Uploaded a new shop logo' };
    case 'shop.logo.remove':
      return { text: 'Removed the shop logo' };
    case 'dyno.create':
      return { text: 'Added dyno ', link: { label: str(d.name) ?? 'a dyno', to: paths.dynos } };
    case 'dyno.update':
      return { text: 'Edited dyno ', link: { label: str(d.name) ?? 'settings', to: paths.dynos } };
    case 'dyno.delete':
      return { text: `Removed dyno${quoted(d.name)}` };
    default:
      return { text: fallbackAction(e.action) };
  }
}

function describeUserChange(d: Record<string, unknown>): string {
  const before = (d.before ?? {}) as { name?: string; role?: string; disabled?: boolean };
  const after = (d.after ?? {}) as { name?: string; role?: string; disabled?: boolean };
  const who = after.name ?? before.name ?? 'a user';
  const parts: string[] = [];
  if (before.role && after.role && before.role !== after.role) parts.push(`Changed role of ${who} from ${roleName(before.role)} to ${roleName(after.role)}`);
  if (before.disabled !== after.disabled && after.disabled !== undefined) parts.push(after.disabled ? `Turned off sign-in for ${who}` : `Let ${who} sign in again`);
  if (before.name && after.name && before.name !== after.name) parts.push(`Renamed ${before.name} to ${after.name}`);
  return parts.join('; ') || `Edited user ${who}`;
}

/** "customer.update" → "Customer updated"; unknown verbs are shown as they are. */
const VERBS: Record<string, string> = { create: 'created', update: 'updated', delete: 'deleted' };
function fallbackAction(action: string) {
  const [thing, verb] = action.split('.');
  if (!verb) return action;
  const noun = thing.charAt(0).toUpperCase() + thing.slice(1).replace(/-/g, ' ');
  return `${noun} ${VERBS[verb] ?? verb.replace(/-/g, ' ')}`;
}

/** Ids, hashes and nested values: kept for the record, shown only on request. */
function TechnicalDetails({ entry }: { entry: AuditEntry }) {
  const rows: [string, string][] = [
    ['Action', entry.action],
    [`${entry.entityType} id`, entry.entityId],
    ...Object.entries(entry.details ?? {})
      .filter(([, v]) => v !== null && v !== undefined && v !== '')
      .map(([k, v]): [string, string] => [k, typeof v === 'object' ? JSON.stringify(v) : String(v)]),
  ];
  return (
    <details className="text-sm">
      <summary className="focus-ring cursor-pointer rounded-control text-ink-muted">Technical details</summary>
      <dl className="mt-2 grid grid-cols-[max-content_minmax(0,1fr)] gap-x-3 gap-y-1">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-ink-muted">{k}</dt>
            <dd className="break-all font-mono text-xs leading-5">{v}</dd>
          </div>
        ))}
      </dl>
    </details>
  );
}

function Action({ entry }: { entry: AuditEntry }) {
  const s = describeEntry(entry);
  return (
    <span>
      {s.text}
      {s.link && (
        <Link to={s.link.to} className="focus-ring rounded-control text-accent underline underline-offset-2">
          {s.link.label}
        </Link>
      )}
      {s.after}
    </span>
  );
}

const col = createColumnHelper<AuditEntry>();
const columns = [
  col.accessor('at', { header: 'When', meta: { numeric: true }, cell: (c) => <time dateTime={c.getValue()}>{formatDateTime(c.getValue())}</time> }),
  col.accessor('userName', { header: 'Who', cell: (c) => c.getValue() ?? <span className="text-ink-subtle">System</span> }),
  col.accessor('action', { header: 'What', meta: { wrap: true }, cell: (c) => <Action entry={c.row.original} /> }),
  col.display({ id: 'details', header: 'Details', meta: { wrap: true }, cell: (c) => <TechnicalDetails entry={c.row.original} /> }),
];

/** Owner only: the guard is the settings layout route (../routes.tsx). */
export default function AuditPage() {
  usePageTitle('Audit log');
  const [params, setParams] = useSearchParams();
  const type = ACTION_TYPES.find((t) => t.value === params.get('type')) ?? ACTION_TYPES[0];
  const audit = useInfiniteQuery(adminQueries.audit(type.prefixes));
  const rows = audit.data?.pages.flat() ?? [];
  return (
    <>
      <PageHeader title="Audit log" subtitle="Who changed what in this shop, newest first. Entries cannot be edited or removed." />
      {audit.isError && !audit.data ? (
        <ErrorState error={audit.error} onRetry={() => audit.refetch()} isRetrying={audit.isFetching} />
      ) : (
        <>
          <div className="mb-4 flex flex-wrap items-end gap-4">
            <SelectField
              label="Kind of change"
              containerClassName="w-72 max-w-full"
              value={type.value}
              onChange={(e) =>
                setParams(
                  (p) => {
                    if (e.target.value) p.set('type', e.target.value);
                    else p.delete('type');
                    return p;
                  },
                  { replace: true },
                )
              }
              options={ACTION_TYPES.map((t) => ({ value: t.value, label: t.label }))}
            />
            {audit.isSuccess && (
              <p className="pb-2 text-sm text-ink-muted" aria-live="polite">
                {`${formatCount(rows.length, 'entry', 'entries')}${type.prefixes.length ? ' of this kind' : ''} loaded`}
                {audit.hasNextPage ? '; older ones are a click away.' : '.'}
              </p>
            )}
          </div>
          <DataTable
            caption="Audit log"
            columns={columns}
            data={rows}
            getRowId={(r) => r.id}
            isLoading={audit.isPending}
            maxHeight={null}
            emptyMessage={type.prefixes.length ? 'No changes of this kind recorded.' : 'Nothing recorded yet. Changes to customers, bikes, users and settings appear here.'}
          />
          {audit.hasNextPage && (
            <div className="mt-4 flex justify-center">
              <Button onClick={() => audit.fetchNextPage()} loading={audit.isFetchingNextPage} loadingText="Loading…">
                Show older entries
              </Button>
            </div>
          )}
        </>
      )}
    </>
  );
}
