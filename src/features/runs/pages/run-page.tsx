import { useId, useMemo, useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { CORRECTION_IDS, type CorrectionId, type RunDetailDto } from '@shared/schemas/run';
import { STAFF, WORKSHOP } from '@shared/roles';
import { GASOLINE_STOICH_AFR } from '@shared/analysis/units';
import { Badge, Button, Card, Caution, ConfirmDialog, ErrorState, Icon, LoadingState, PageHeader, SelectField, Stat, StatusBadge, useToast } from '@/components/ui';
import { formatDateTime, formatFileSize, formatNumber, formatRpmRange, MISSING } from '@shared/format';
import { useCurrentUser } from '@/lib/auth';
import { ApiError } from '@/lib/api-client';
import { paths } from '@/config/paths';
import { formatAirTemperature, formatBarometric } from '@shared/units-display';
import { useShopUnits } from '@/lib/shop-query';
import { runQueries } from '../api/runs/run-queries';
import { useDeleteRun } from '../api/runs/delete-run';
import { useRestoreRun } from '../api/runs/restore-run';
import { displayCurve, mixtureChannels, POWER_LABEL, TORQUE_LABEL, type MixtureChoice, type PowerChoice, type TorqueChoice } from '../lib/display-curve';
import { AfrChart, RunChart } from '../components/run-chart';
import { CORRECTION_HINT, CORRECTION_OPTIONS } from '../lib/correction';
import { CrossCheckBadge, RunFlags, RunStatusBadge } from '../components/run-status';
import { MappingDialog } from '../components/mapping-dialog';
import { RunEditForm } from '../components/run-edit-form';
import { usePageTitle } from '@/lib/page-title';
import { runFileLabel, runName } from '@shared/labels';

const STANDARD_OPTIONS = CORRECTION_OPTIONS;
const STOICH = formatNumber(GASOLINE_STOICH_AFR, { decimals: 1 });

function pick<T extends string>(value: string | null, allowed: readonly T[], fallback: T): T {
  return value !== null && (allowed as readonly string[]).includes(value) ? (value as T) : fallback;
}

/**
 * The run page's view choices, kept in the URL search params so a reload or a shared link keeps
 * them: ?power=kw&torque=nm&correction=din-70020&mixture=lambda. Defaults are left out of the URL.
 */
function useViewChoices(defaultStandard: CorrectionId) {
  const [params, setParams] = useSearchParams();
  const power = pick<PowerChoice>(params.get('power'), ['hp', 'kw'], 'hp');
  const torque = pick<TorqueChoice>(params.get('torque'), ['lbft', 'nm'], 'lbft');
  const standard = pick<CorrectionId>(params.get('correction'), CORRECTION_IDS, defaultStandard);
  const mixture = pick<MixtureChoice>(params.get('mixture'), ['afr', 'lambda'], 'afr');
  const set = (key: 'power' | 'torque' | 'correction' | 'mixture', value: string, fallback: string) =>
    setParams(
      (old) => {
        const next = new URLSearchParams(old);
        if (value === fallback) next.delete(key);
        else next.set(key, value);
        return next;
      },
      { replace: true },
    );
  return {
    power,
    torque,
    standard,
    mixture,
    setPower: (v: PowerChoice) => set('power', v, 'hp'),
    setTorque: (v: TorqueChoice) => set('torque', v, 'lbft'),
    setStandard: (v: CorrectionId) => set('correction', v, defaultStandard),
    setMixture: (v: MixtureChoice) => set('mixture', v, 'afr'),
  };
}

function CurveCard({ run }: { run: RunDetailDto }) {
  const { power, torque, standard, mixture, setPower, setTorque, setStandard, setMixture } = useViewChoices(run.correctionStandard ?? 'none');
  const correctionHintId = useId();
  const mixtureHintId = useId();
  const curve = useMemo(() => displayCurve(run, standard, power, torque), [run, standard, power, torque]);
  const pu = POWER_LABEL[power];
  const tu = TORQUE_LABEL[torque];
  const std = STANDARD_OPTIONS.find((o) => o.value === standard)?.label;
  if (!curve) return null;
  const hasAfr = Object.keys(curve.afr).length > 0;
  const crossing = power === 'hp' && torque === 'lbft' ? ' In hp and lb·ft the two curves cross at 5,252 rpm.' : power === 'kw' && torque === 'nm' ? ' In kW and N·m they cross at 9,549 rpm.' : '';
  return (
    <>
      <Card
        title="Power and torque"
        description={`${standard === 'none' || curve.problem ? 'Uncorrected' : `Corrected to ${std}`}. Power is the solid line, torque the dashed one, on one shared scale.${crossing}`}
        actions={
          <div className="max-w-md space-y-1.5">
            <div className="flex flex-wrap items-end gap-2">
              <SelectField label="Power unit" containerClassName="w-28" value={power} onChange={(e) => setPower(e.target.value as PowerChoice)} options={[{ value: 'hp', label: 'hp' }, { value: 'kw', label: 'kW' }]} />
              <SelectField label="Torque unit" containerClassName="w-28" value={torque} onChange={(e) => setTorque(e.target.value as TorqueChoice)} options={[{ value: 'lbft', label: 'lb·ft' }, { value: 'nm', label: 'N·m' }]} />
              <SelectField label="Correction" containerClassName="w-48" value={standard} onChange={(e) => setStandard(e.target.value as CorrectionId)} options={STANDARD_OPTIONS} aria-describedby={correctionHintId} />
            </div>
            <p id={correctionHintId} className="text-sm text-ink-muted">
              {CORRECTION_HINT}
            </p>
          </div>
        }
      >
        {curve.problem && (
          <Caution kind="notice" title="Shown uncorrected" className="mb-3">
            {curve.problem} Add the session's conditions to correct this run.
          </Caution>
        )}
        <RunChart curve={curve} powerUnit={pu} torqueUnit={tu} title={runName(run)} />
        <div className="mt-4 grid grid-cols-2 gap-4 border-t border-line pt-4 lg:grid-cols-4">
          <Stat label="Peak power" value={curve.peakPower?.value} unit={pu} size="lg" detail={`at ${formatNumber(curve.peakPower?.rpm)} rpm`} />
          <Stat label="Peak torque" value={curve.peakTorque?.value} unit={tu} size="lg" detail={`at ${formatNumber(curve.peakTorque?.rpm)} rpm`} />
          <Stat label="Rpm range" value={formatRpmRange(curve.rpm[0], curve.rpm[curve.rpm.length - 1])} />
          <Stat label="Correction factor" value={standard === 'none' || curve.problem ? 'none' : formatNumber(curve.factor, { decimals: 4 })} detail={curve.problem ? 'could not be computed' : std} />
        </div>
      </Card>
      {hasAfr && (
        <Card
          title={mixture === 'afr' ? 'Air–fuel ratio' : 'Lambda'}
          description={
            <>
              {mixtureChannels(curve.afr, mixture)
                .map((c) => c.label)
                .join(', ')}
              .{' '}
              <span id={mixtureHintId} className="underline decoration-dotted underline-offset-2" title={`${STOICH} is the stoichiometric air–fuel ratio of gasoline, common practice for petrol; other fuels and blends (E85, methanol) differ.`}>
                Lambda = AFR ÷ {STOICH}, the gasoline stoichiometric ratio (common practice for petrol).
              </span>
            </>
          }
          actions={
            <SelectField
              label="Show mixture as"
              containerClassName="w-56"
              value={mixture}
              onChange={(e) => setMixture(e.target.value as MixtureChoice)}
              aria-describedby={mixtureHintId}
              options={[
                { value: 'afr', label: 'AFR (air–fuel ratio)' },
                { value: 'lambda', label: 'Lambda' },
              ]}
            />
          }
        >
          <AfrChart curve={curve} mode={mixture} />
          <Caution className="mt-3" title="Mixture and engine heat">
            Leaner mixtures and more power raise cylinder-head temperatures. Defer to licensed technicians and the engine maker&apos;s specifications before changing fuelling.
          </Caution>
        </Card>
      )}
    </>
  );
}

function Facts({ run }: { run: RunDetailDto }) {
  const c = run.conditions ?? {};
  const units = useShopUnits();
  const rows: [string, string][] = [
    ['Air temperature', formatAirTemperature(typeof c.temperatureC === 'number' ? c.temperatureC : null, units)],
    ['Barometric pressure', formatBarometric(typeof c.baroKpa === 'number' ? c.baroKpa : null, units)],
    ['Relative humidity', typeof c.humidityPct === 'number' ? `${formatNumber(c.humidityPct)} %` : 'not recorded'],
    ['Dyno', run.dynoName ?? MISSING],
    ['Uploaded', `${formatDateTime(run.createdAt)}${run.uploadedByName ? ` by ${run.uploadedByName}` : ''}`],
    ['File', `${run.originalName} (${formatFileSize(run.rawSizeBytes)})`],
    ['SHA-256', run.rawSha256 ? `${run.rawSha256.slice(0, 16)}…` : MISSING],
  ];
  return (
    <Card title="Conditions and file">
      <dl className="num grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-ink-muted">{k}</dt>
            <dd className="min-w-0 break-words text-ink">{v}</dd>
          </div>
        ))}
      </dl>
    </Card>
  );
}

function RunView({ run }: { run: RunDetailDto }) {
  const user = useCurrentUser();
  const toast = useToast();
  const navigate = useNavigate();
  const [mapping, setMapping] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const del = useDeleteRun();
  const restore = useRestoreRun();
  const canEdit = WORKSHOP.includes(user.role);
  const isOwner = user.role === 'owner';
  const isStaff = STAFF.includes(user.role);
  const deleted = Boolean(run.deletedAt);
  const name = runName(run);
  return (
    <div className="mx-auto max-w-7xl space-y-5">
      <PageHeader
        back={
          isStaff ? (
            <Link to={paths.runs} className="font-semibold text-accent">
              ← All runs
            </Link>
          ) : undefined
        }
        title={name}
        subtitle={
          <>
            <span className="font-semibold text-ink">{runFileLabel(run)}</span> ·{' '}
            <Link className="underline" to={paths.bike(run.bikeId)}>
              {run.bikeLabel}
            </Link>{' '}
            · {run.customerName}
            {run.sessionId && isStaff && (
              <>
                {' '}
                ·{' '}
                <Link className="underline" to={paths.session(run.sessionId)}>
                  session
                </Link>
              </>
            )}
          </>
        }
        meta={
          <>
            <RunStatusBadge status={run.status} deleted={deleted} />
            {run.status === 'ready' && <CrossCheckBadge status={run.identityStatus} />}
            <RunFlags run={run} />
            {run.stageName && <Badge tone="accent">Stage: {run.stageName}</Badge>}
            {run.isReference && <StatusBadge status="info">Reference run of its stage</StatusBadge>}
            {run.tags.map((t) => (
              <Badge key={t}>#{t}</Badge>
            ))}
          </>
        }
        secondaryActions={
          <>
            {isStaff && (
              <a href={`/api/runs/${run.id}/raw`} download={run.originalName} className="inline-flex min-h-11 items-center gap-2 rounded-control border border-line-strong bg-paper-raised px-4 font-semibold text-ink hover:bg-paper-sunk">
                <Icon name="file" size={18} /> Download original file
              </a>
            )}
            {isOwner && !deleted && (
              <Button variant="ghost" onClick={() => setConfirmDelete(true)}>
                Delete run
              </Button>
            )}
            {isOwner && deleted && (
              <Button
                variant="primary"
                loading={restore.isPending}
                onClick={() => restore.mutate(run.id, { onSuccess: () => toast.success('Run restored'), onError: (e) => toast.error('The run was not restored', { description: e.message }) })}
              >
                Restore run
              </Button>
            )}
          </>
        }
      />
      {deleted && (
        <Caution kind="notice" title="This run is deleted">
          Deleted {formatDateTime(run.deletedAt)}. It is left out of lists, comparisons and reports until the owner restores it.
        </Caution>
      )}
      {run.status === 'needs-mapping' && (
        <Caution kind="notice" title="Pullbook needs to know which columns to read">
          <p>{run.error?.message ?? 'No engine-speed column was recognised in this file.'}</p>
          {canEdit && (
            <Button className="mt-2" variant="primary" onClick={() => setMapping(true)}>
              Choose columns…
            </Button>
          )}
          <MappingDialog runId={run.id} fileName={run.originalName} error={run.error} open={mapping} onClose={() => setMapping(false)} onMapped={() => toast.success('File read with the chosen columns')} />
        </Caution>
      )}
      {run.status === 'failed' && (
        <Caution kind="notice" title="This file could not be read">
          {run.error?.message ?? 'The file did not contain a usable pull.'} The original is kept and can be read again after a fix.
        </Caution>
      )}
      {run.review && (
        <Caution kind="notice" title="Marked for review">
          More than a tenth of this pull's samples were impossible engine-speed or load jumps and were dropped. Check the file and the trace by hand before trusting these figures; comparisons and reports that use this run say so.
        </Caution>
      )}
      {run.status === 'ready' && run.curve && <CurveCard run={run} />}
      <div className="grid gap-5 md:grid-cols-2">
        <Facts run={run} />
        <Card title="Warnings">
          {run.warnings.length ? (
            <ul className="space-y-2">
              {run.warnings.map((w) => (
                <li key={w.code + w.message} className="flex gap-2" data-code={w.code}>
                  <Icon name="triangle" size={18} className="mt-0.5 shrink-0 text-warn" />
                  <span>{w.message}</span>
                </li>
              ))}
            </ul>
          ) : run.status === 'ready' ? (
            <p className="text-ink-muted">No warnings: the file read cleanly.</p>
          ) : (
            <p className="text-ink-muted">{run.status === 'failed' ? 'No curve was read from this file, so there is nothing to check yet.' : 'Warnings appear once the columns are chosen and the file is read.'}</p>
          )}
          {run.note && (
            <div className="mt-4 border-t border-line pt-3">
              <h3 className="text-sm font-semibold text-ink-muted">Note</h3>
              <p className="whitespace-pre-wrap">{run.note}</p>
            </div>
          )}
        </Card>
      </div>
      {canEdit && !deleted && (
        <Card title="Stage, tags and note">
          <RunEditForm run={run} />
        </Card>
      )}
      <ConfirmDialog
        open={confirmDelete}
        title={`Delete ${name}?`}
        confirmLabel="Delete run"
        tone="danger"
        isConfirming={del.isPending}
        onCancel={() => setConfirmDelete(false)}
        onConfirm={() =>
          del.mutate(run.id, {
            onSuccess: () => {
              setConfirmDelete(false);
              toast.success('Run deleted', { description: 'The owner can restore it from this page.' });
              navigate(paths.run(run.id), { replace: true });
            },
            onError: (e) => toast.error('The run was not deleted', { description: e.message }),
          })
        }
      >
        The run leaves lists, comparisons and reports. The original file is kept, and the owner can restore the run.
      </ConfirmDialog>
    </div>
  );
}

export function RunPage() {
  const { runId = '' } = useParams();
  const run = useQuery(runQueries.detail(runId));
  usePageTitle(run.data ? runName(run.data) : 'Run');
  if (run.isLoading) return <LoadingState message="Loading the run…" />;
  if (run.isError)
    return (
      <ErrorState
        title={run.error instanceof ApiError && run.error.status === 404 ? 'No such run' : "The run didn't load"}
        error={run.error}
        onRetry={() => run.refetch()}
        isRetrying={run.isFetching}
      />
    );
  return <RunView run={run.data!} />;
}
