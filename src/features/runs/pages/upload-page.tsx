import { useEffect, useMemo, useRef, useState, type ReactNode } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import type { SessionDto } from '@shared/schemas/run';
import { Button, Card, DropZone, ErrorState, Icon, LoadingState, PageHeader, SelectField, useToast } from '@/components/ui';
import type { UploadResult } from '@shared/schemas/run';
import { formatCount, formatDateTime, formatNumber } from '@shared/format';
import { paths } from '@/config/paths';
import { formatAirTemperature, formatBarometric } from '@shared/units-display';
import { shopQuery, useShopUnits } from '@/lib/shop-query';
import { bikeLabel, lookupQueries } from '../api/runs/run-queries';
import { sessionQueries } from '../api/sessions/session-queries';
import { useUploadRuns } from '../api/runs/upload-runs';
import { BikePicker } from '../components/bike-picker';
import { SessionForm } from '../components/sessions/session-form';
import { CORRECTION_OPTIONS } from '../lib/correction';
import { SafetyChecklist } from '../components/sessions/safety-checklist';
import { UploadResults } from '../components/upload-results';
import { UploadStageField } from '../components/stages/upload-stage-field';
import { LeaveGuard } from '../components/leave-guard';
import { BulkActionBar, useRunSelection, type SelectableRun } from '../components/bulk-actions';
import { usePageTitle } from '@/lib/page-title';

const ACCEPT = ['.csv', '.txt', '.tsv', '.log', '.dat'];
const MAX_BYTES = 50_000_000;

export function sessionLabel(s: SessionDto): string {
  return `${formatDateTime(s.startedAt)}${s.dynoName ? ` · ${s.dynoName}` : ''} · ${formatCount(s.runCount, 'run')}`;
}

/** Sessions of the bike started today (local date). */
export function todaysSessions(list: SessionDto[], now = new Date()): SessionDto[] {
  const day = (d: Date) => `${d.getFullYear()}-${d.getMonth()}-${d.getDate()}`;
  return list.filter((x) => day(new Date(x.startedAt)) === day(now));
}

function Conditions({ s }: { s: SessionDto }) {
  const units = useShopUnits();
  const std = CORRECTION_OPTIONS.find((o) => o.value === s.correctionStandard)?.label ?? s.correctionStandard;
  return (
    <dl className="num grid grid-cols-2 gap-x-6 gap-y-1 text-sm md:grid-cols-4">
      <div>
        <dt className="text-ink-muted">Air temperature</dt>
        <dd className="font-medium">{formatAirTemperature(s.ambientTempC, units)}</dd>
      </div>
      <div>
        <dt className="text-ink-muted">Barometric pressure</dt>
        <dd className="font-medium">{formatBarometric(s.baroKpa, units)}</dd>
      </div>
      <div>
        <dt className="text-ink-muted">Humidity</dt>
        <dd className="font-medium">{s.humidityPct === null ? 'not recorded' : `${formatNumber(s.humidityPct)} %`}</dd>
      </div>
      <div>
        <dt className="text-ink-muted">Correction</dt>
        <dd className="font-medium">{std}</dd>
      </div>
    </dl>
  );
}

/** A step's title; when `focusWhen` turns true after the page has opened, focus moves to its heading. */
function StepTitle({ n, children, focusWhen }: { n: number; children: ReactNode; focusWhen?: boolean }) {
  const ref = useRef<HTMLSpanElement>(null);
  const was = useRef(focusWhen);
  useEffect(() => {
    if (focusWhen && !was.current) {
      const heading = ref.current?.closest('h2');
      if (heading) {
        heading.tabIndex = -1;
        heading.focus();
      }
    }
    was.current = focusWhen;
  }, [focusWhen]);
  return (
    <span ref={ref} className="flex items-center gap-2">
      <span className="num inline-flex size-7 items-center justify-center rounded-full bg-paper-sunk text-sm font-bold text-ink" aria-hidden="true">
        {n}
      </span>
      <span>{children}</span>
    </span>
  );
}

function UploadScreen() {
  const toast = useToast();
  const [params, setParams] = useSearchParams();
  const bikeId = params.get('bikeId') ?? '';
  const sessionId = params.get('sessionId') ?? '';
  const [creating, setCreating] = useState(false);
  const [files, setFiles] = useState<File[]>([]);
  const [stageId, setStageId] = useState('');
  const upload = useUploadRuns();

  const bike = useQuery({ ...lookupQueries.bike(bikeId), enabled: Boolean(bikeId) });
  const sessions = useQuery({ ...sessionQueries.list(bikeId), enabled: Boolean(bikeId) });
  const session = useQuery({ ...sessionQueries.detail(sessionId), enabled: Boolean(sessionId) });
  const shop = useQuery(shopQuery());

  const setParam = (next: Record<string, string | null>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(next)) {
      if (v) p.set(k, v);
      else p.delete(k);
    }
    setParams(p, { replace: true });
  };

  // When exactly one session of this bike was started today, choose it for the tuner (once per
  // bike, so clearing the choice sticks).
  const preselectedFor = useRef<string | null>(null);
  useEffect(() => {
    if (!bikeId || sessionId || creating || !sessions.data || preselectedFor.current === bikeId) return;
    preselectedFor.current = bikeId;
    const today = todaysSessions(sessions.data);
    if (today.length === 1) setParam({ sessionId: today[0].id });
    // setParam is recreated every render; the ref keeps this to one run per bike.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [bikeId, sessionId, creating, sessions.data]);

  const s = session.data;
  const ready = Boolean(bikeId && s && s.safetyConfirmedAt);
  // Read runs of this batch, for ticking several and tagging them at once.
  const selectable = useMemo<SelectableRun[]>(
    () =>
      upload.items.flatMap((it) => {
        const r: UploadResult | undefined = it.result;
        if (!r || !r.ok) return [];
        return (r.runs && r.runs.length > 1 ? r.runs : [r.run]).filter((run) => run.status === 'ready').map((run) => ({ id: run.id, stageId: run.stageId, name: it.file.name }));
      }),
    [upload.items],
  );
  const selection = useRunSelection(selectable);
  const resultsShown = upload.items.length > 0 && !upload.running;
  const resultsWere = useRef(resultsShown);
  useEffect(() => {
    if (resultsShown && !resultsWere.current) document.getElementById('upload-results-h')?.focus();
    resultsWere.current = resultsShown;
  }, [resultsShown]);

  const startUpload = async () => {
    if (!ready || !files.length) return;
    const batch = files;
    setFiles([]);
    await upload.start(batch, { bikeId, sessionId, stageId: stageId || undefined });
    toast.success(`Finished ${formatCount(batch.length, 'file')}`, { description: 'Each file’s result is listed below and on the session page.' });
  };

  return (
    // Toasts stack in the bottom-right corner; the bottom padding lets every control of the file
    // list scroll clear of them.
    <div className="mx-auto max-w-6xl space-y-5 pb-56">
      <LeaveGuard active={upload.running} what="files are uploading" />
      <PageHeader title="Upload runs" subtitle="Choose the bike and the session, confirm the bay checks, then drop the session's files." />

      <Card title={<StepTitle n={1}>Bike</StepTitle>} actions={bikeId && <Button size="sm" onClick={() => setParam({ bikeId: null, sessionId: null })}>Change bike</Button>}>
        {!bikeId ? (
          <BikePicker onPick={(b) => setParam({ bikeId: b.id, sessionId: null })} />
        ) : bike.isLoading ? (
          <LoadingState compact />
        ) : bike.isError ? (
          <ErrorState error={bike.error} onRetry={() => bike.refetch()} />
        ) : (
          <p className="text-lg">
            <span className="font-semibold">{bike.data && bikeLabel(bike.data)}</span> <span className="text-ink-muted">· {bike.data?.customerName}</span>
          </p>
        )}
      </Card>

      {bikeId && (
        <Card
          title={<StepTitle n={2} focusWhen={Boolean(bikeId)}>Session</StepTitle>}
          description="One visit on the dyno, with the air conditions used for correction."
          actions={
            !creating && (
              <Button size="sm" icon={<Icon name="plus" size={16} />} onClick={() => setCreating(true)}>
                New session
              </Button>
            )
          }
        >
          {creating ? (
            <SessionForm
              bikeId={bikeId}
              units={shop.data?.units ?? 'imperial'}
              onCancel={() => setCreating(false)}
              onCreated={(created) => {
                setCreating(false);
                setParam({ sessionId: created.id });
                toast.success('Session created');
              }}
            />
          ) : sessions.isLoading ? (
            <LoadingState compact message="Loading sessions…" />
          ) : sessions.isError ? (
            <ErrorState error={sessions.error} onRetry={() => sessions.refetch()} />
          ) : (
            <div className="space-y-3">
              {sessions.data?.length ? (
                <SelectField
                  label="Session"
                  placeholder="Choose a session…"
                  value={sessionId}
                  onChange={(e) => setParam({ sessionId: e.target.value || null })}
                  options={sessions.data.map((x) => ({ value: x.id, label: sessionLabel(x) }))}
                />
              ) : (
                <p className="text-ink-muted">This bike has no sessions yet. Start one with “New session”.</p>
              )}
              {s && <Conditions s={s} />}
              {s && (
                <Link className="text-sm font-semibold text-accent underline" to={paths.session(s.id)}>
                  Open the session page
                </Link>
              )}
            </div>
          )}
        </Card>
      )}

      {s && (
        <Card title={<StepTitle n={3} focusWhen={Boolean(s)}>Safety checks</StepTitle>}>
          <SafetyChecklist session={s} canConfirm />
        </Card>
      )}

      {s && (
        <Card title={<StepTitle n={4} focusWhen={ready}>Run files</StepTitle>} description={ready ? 'Drop every file of the session at once; each is read on its own.' : 'Confirm the safety checks first.'}>
          <div className="space-y-4">
            <UploadStageField bikeId={bikeId} value={stageId} onChange={setStageId} disabled={!ready} />
            <DropZone
              label="Run files"
              hint="CSV or text exports from the dyno PC, up to 50 MB each."
              accept={ACCEPT}
              maxSizeBytes={MAX_BYTES}
              files={files}
              onFilesChange={setFiles}
              disabled={!ready}
            />
            <div className="flex flex-wrap items-center gap-2">
              <Button variant="primary" icon={<Icon name="upload" size={18} />} disabled={!ready || !files.length} onClick={startUpload}>
                {files.length ? `Upload ${formatCount(files.length, 'file')}` : 'Upload files'}
              </Button>
              {upload.running && (
                <Button variant="ghost" onClick={upload.cancel}>
                  Cancel uploads
                </Button>
              )}
              {!upload.running && upload.items.length > 0 && (
                <Button variant="ghost" onClick={upload.clear}>
                  Clear the list
                </Button>
              )}
              {!upload.running && upload.items.some((it) => it.result?.ok) && (
                // The builder opens on the previous stage against the latest: compare without picking.
                <Link to={`${paths.newComparison}?bikeId=${bikeId}`} className="ml-auto inline-flex min-h-11 items-center rounded-control px-3 font-semibold text-accent underline-offset-2 hover:underline">
                  Compare the stages
                </Link>
              )}
            </div>
            <UploadResults items={upload.items} bikeId={bikeId} onResult={upload.updateResult} selection={selection} />
          </div>
        </Card>
      )}
      {bikeId && <BulkActionBar bikeId={bikeId} selection={selection} onStageSet={upload.setStage} />}
    </div>
  );
}

/** The upload screen; the route admits only the tuner and the owner (RequireRole in routes.tsx). */
export function UploadPage() {
  usePageTitle('Upload runs');
  return <UploadScreen />;
}
