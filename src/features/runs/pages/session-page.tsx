import { useMemo } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { RunSummaryDto, SessionDto, StageDto } from '@shared/schemas/run';
import { WORKSHOP } from '@shared/roles';
import { Button, Card, DataTable, ErrorState, Icon, LoadingState, PageHeader, StatusBadge, useToast } from '@/components/ui';
import { formatDateTime, formatNumber } from '@shared/format';
import { useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { formatAirTemperature, formatBarometric } from '@shared/units-display';
import { useShopUnits } from '@/lib/shop-query';
import { bikeLabel, lookupQueries, runQueries } from '../api/runs/run-queries';
import { sessionQueries } from '../api/sessions/session-queries';
import { stageQueries } from '../api/stages/stage-queries';
import { useSetReferenceRun } from '../api/stages/set-reference-run';
import { RunStatusBadge } from '../components/run-status';
import { peakPowerColumn, peakTorqueColumn, runColumn, runNameColumn } from '../components/run-columns';
import { StageSelect } from '../components/stages/stage-select';
import { SafetyChecklist } from '../components/sessions/safety-checklist';
import { PullFilesNote } from '../components/pull-results';
import { LatestUpload } from '../components/sessions/latest-upload';
import { BulkActionBar, useRunSelection, type SelectableRun } from '../components/bulk-actions';
import { SelectRunBox } from '../components/run-grid';
import { runName } from '@shared/labels';
import { CORRECTION_OPTIONS } from '../lib/correction';
import { usePageTitle } from '@/lib/page-title';

const col = runColumn;

function ReferenceCell({ run, stages, canEdit }: { run: RunSummaryDto; stages: StageDto[]; canEdit: boolean }) {
  const setRef = useSetReferenceRun();
  const toast = useToast();
  const stage = stages.find((s) => s.id === run.stageId);
  const isRef = run.isReference || (stage?.referenceRunId === run.id);
  if (isRef) return <StatusBadge status="ok">Reference of {stage?.name ?? 'its stage'}</StatusBadge>;
  if (!stage) return <span className="text-sm text-ink-subtle">Tag a stage first</span>;
  if (!canEdit || run.status !== 'ready') return <span className="text-sm text-ink-subtle">—</span>;
  return (
    <Button
      size="sm"
      loading={setRef.isPending}
      aria-label={`Make reference: ${runName(run)} (${run.originalName}) for ${stage.name}`}
      onClick={() =>
        setRef.mutate(
          { stageId: stage.id, runId: run.id },
          {
            onSuccess: () => toast.success(`${runName(run)} (${run.originalName}) now represents ${stage.name}`),
            onError: (e) => toast.error('The reference run was not changed', { description: e.message }),
          },
        )
      }
    >
      Make reference
    </Button>
  );
}

function Summary({ s }: { s: SessionDto }) {
  const units = useShopUnits();
  const std = CORRECTION_OPTIONS.find((o) => o.value === s.correctionStandard)?.label ?? s.correctionStandard;
  const items: [string, string][] = [
    ['Dyno', s.dynoName ?? 'not recorded'],
    ['Operator', s.operatorName ?? 'not recorded'],
    ['Air temperature', formatAirTemperature(s.ambientTempC, units)],
    ['Barometric pressure', formatBarometric(s.baroKpa, units)],
    ['Relative humidity', s.humidityPct === null ? 'not recorded' : `${formatNumber(s.humidityPct)} %`],
    ['Correction', std],
  ];
  return (
    <dl className="num grid grid-cols-2 gap-x-6 gap-y-2 md:grid-cols-3">
      {items.map(([k, v]) => (
        <div key={k}>
          <dt className="text-sm text-ink-muted">{k}</dt>
          <dd className="font-medium text-ink">{v}</dd>
        </div>
      ))}
      {s.notes && (
        <div className="col-span-full">
          <dt className="text-sm text-ink-muted">Notes</dt>
          <dd className="whitespace-pre-wrap">{s.notes}</dd>
        </div>
      )}
    </dl>
  );
}

/** One dyno visit: its conditions, safety checks and every run, tagged by stage. */
export function SessionPage() {
  const { sessionId = '' } = useParams();
  const user = useCurrentUser();
  const canEdit = WORKSHOP.includes(user.role);
  const session = useQuery(sessionQueries.detail(sessionId));
  usePageTitle(session.data ? `Session of ${formatDateTime(session.data.startedAt)}` : 'Session');
  const bikeId = session.data?.bikeId ?? '';
  const bike = useQuery({ ...lookupQueries.bike(bikeId), enabled: Boolean(bikeId) });
  const runs = useQuery({ ...runQueries.list({ sessionId, pageSize: 200, sort: 'createdAt' }), enabled: Boolean(sessionId) });
  const stages = useQuery({ ...stageQueries.list(bikeId), enabled: Boolean(bikeId) });
  const stageList = useMemo(() => stages.data ?? [], [stages.data]);
  const selectable = useMemo<SelectableRun[]>(() => (runs.data?.items ?? []).filter((r) => r.status === 'ready' && !r.deletedAt).map((r) => ({ id: r.id, stageId: r.stageId, name: r.originalName })), [runs.data]);
  const selection = useRunSelection(selectable);
  const { selected, toggle, selectAll } = selection;

  const columns = useMemo(
    () => [
      ...(canEdit
        ? [
            col.display({
              id: 'select',
              header: () => selectAll,
              cell: (c) =>
                c.row.original.status === 'ready' ? <SelectRunBox label={`Select ${c.row.original.originalName}`} checked={selected.has(c.row.original.id)} onChange={(on) => toggle(c.row.original.id, on)} /> : null,
            }),
          ]
        : []),
      // At 768 px the name, its status and the editable stage and reference stay in view; the pull
      // number (also in the name) and the peaks fold behind "All columns".
      col.accessor('sequence', { header: 'Pull', meta: { numeric: true, priority: 'extra' } }),
      runNameColumn('key'),
      col.accessor('status', { header: 'Status', cell: (c) => <RunStatusBadge status={c.getValue()} /> }),
      peakPowerColumn('extra'),
      peakTorqueColumn('extra'),
      col.display({
        id: 'stage',
        header: 'Stage',
        meta: { priority: 'key' },
        cell: (c) =>
          canEdit ? (
            <StageSelect runId={c.row.original.id} bikeId={c.row.original.bikeId} stageId={c.row.original.stageId} runName={c.row.original.originalName} />
          ) : (
            (c.row.original.stageName ?? 'none')
          ),
      }),
      col.display({ id: 'reference', header: 'Reference run', meta: { priority: 'key' }, cell: (c) => <ReferenceCell run={c.row.original} stages={stageList} canEdit={canEdit} /> }),
    ],
    [canEdit, stageList, selected, toggle, selectAll],
  );

  if (session.isLoading) return <LoadingState message="Loading the session…" />;
  if (session.isError) return <ErrorState error={session.error} onRetry={() => session.refetch()} />;
  const s = session.data!;
  const uploadMore = `${paths.upload}?bikeId=${s.bikeId}&sessionId=${s.id}`;
  return (
    <div className="mx-auto max-w-7xl space-y-5 pb-32">
      <PageHeader
        back={
          <Link to={paths.bike(s.bikeId)} className="font-semibold text-accent">
            ← {bike.data ? bikeLabel(bike.data) : 'Bike'}
          </Link>
        }
        title={`Session of ${formatDateTime(s.startedAt)}`}
        subtitle={bike.data ? `${bikeLabel(bike.data)} · ${bike.data.customerName}` : undefined}
        meta={s.safetyConfirmedAt ? <StatusBadge status="ok">Safety checks confirmed</StatusBadge> : <StatusBadge status="warning">Safety checks not confirmed</StatusBadge>}
        action={
          canEdit && (
            <Link to={uploadMore} className="inline-flex min-h-11 items-center gap-2 rounded-control bg-accent px-4 font-semibold text-white hover:bg-accent-hover">
              <Icon name="upload" size={18} /> Upload more runs
            </Link>
          )
        }
      />
      <div className="grid gap-5 lg:grid-cols-2">
        <Card title="Conditions">
          <Summary s={s} />
        </Card>
        <Card title="Safety checks">
          <SafetyChecklist session={s} canConfirm={canEdit} />
        </Card>
      </div>
      {runs.data && <LatestUpload runs={runs.data.items} canEdit={canEdit} />}
      <Card title="Runs of this session" description="Tag each run with its stage, or tick several and set their stage at once; mark the one that represents the stage." flush>
        {runs.isError ? (
          <ErrorState error={runs.error} onRetry={() => runs.refetch()} />
        ) : (
          <>
          <PullFilesNote runs={runs.data?.items ?? []} />
          <DataTable
            caption="Runs of this session"
            className="rounded-none border-0"
            columns={columns}
            data={runs.data?.items ?? []}
            getRowId={(r) => r.id}
            isLoading={runs.isLoading}
            maxHeight={null}
            emptyMessage={
              <span>
                No runs in this session yet.{' '}
                {canEdit && (
                  <Link className="font-semibold text-accent underline" to={uploadMore}>
                    Upload the files
                  </Link>
                )}
              </span>
            }
          />
          </>
        )}
      </Card>
      {canEdit && <BulkActionBar bikeId={s.bikeId} selection={selection} />}
    </div>
  );
}
