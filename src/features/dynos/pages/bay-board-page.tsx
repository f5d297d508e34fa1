import { useEffect, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { WORKSHOP } from '@shared/roles';
import { SAFETY_CHECKS } from '@shared/schemas/run';
import type { BayBoardDto, BayPullDto } from '@shared/schemas/bay';
import { formatDateTime, formatGain, formatNumber } from '@shared/format';
import { Badge, Button, Card, Caution, EmptyState, ErrorState, Icon, LoadingState, useToast } from '@/components/ui';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { usePageTitle } from '@/lib/page-title';
import { bayQueries } from '../api/bay-queries';
import { useClearDynoCurrent, useConfirmBaySafety, useSetDynoCurrent } from '../api/set-dyno-current';
import { useSessionEvents, type LiveState } from '../api/use-session-events';
import { BayBikePicker } from '../components/bay-bike-picker';
import { BayChart } from '../components/bay-chart';
import { AGENT_QUIET_MS, sinceText } from '../lib/since';

const LIVE_TEXT: Record<LiveState, string> = { connecting: 'Connecting…', live: 'Live', reconnecting: 'Reconnecting…' };

function useNow(everyMs = 5000) {
  const [now, setNow] = useState(Date.now());
  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), everyMs);
    return () => clearInterval(t);
  }, [everyMs]);
  return now;
}

/** The bay board of one dyno, for a tablet on the wall: big type, one tap to set or clear. */
export function BayBoardPage() {
  const { dynoId = '' } = useParams();
  const board = useQuery(bayQueries.board(dynoId));
  usePageTitle(board.data ? `Bay · ${board.data.dyno.name}` : 'Bay board');
  if (board.isPending) return <LoadingState message="Loading the bay board…" />;
  if (board.isError) return <ErrorState error={board.error} onRetry={() => board.refetch()} isRetrying={board.isFetching} />;
  return <Board board={board.data} />;
}

function Board({ board }: { board: BayBoardDto }) {
  const user = useCurrentUser();
  const canSet = hasRole(user, WORKSHOP);
  const now = useNow();
  const { state } = useSessionEvents(board.current?.session.id ?? null, board.dyno.id);
  const clear = useClearDynoCurrent(board.dyno.id);
  const toast = useToast();
  const heard = board.agentLastHeardAt;
  const quiet = !heard || now - new Date(heard).getTime() > AGENT_QUIET_MS;

  return (
    <div className="mx-auto max-w-7xl space-y-6 text-lg">
      <header className="flex flex-wrap items-center gap-x-6 gap-y-2">
        <Link to={paths.bay} className="focus-ring inline-flex items-center gap-1 rounded-control text-ink-muted hover:text-ink">
          <Icon name="chevron-left" size={18} /> Dynos
        </Link>
        <h1 className="text-4xl font-bold">{board.dyno.name}</h1>
        {board.current && (
          <Badge tone={state === 'live' ? 'gain' : 'warn'} icon={<Icon name={state === 'live' ? 'circle-check' : 'refresh'} size={16} />}>
            <span data-testid="live-state">{LIVE_TEXT[state]}</span>
          </Badge>
        )}
        <p className={quiet ? 'text-warn' : 'text-ink-muted'} data-testid="agent-heard">
          Sync agent last heard: <span className="num font-semibold">{sinceText(heard, now)}</span>
          {board.activeTokens === 0 && ' · no device token: make one on the Dynos settings page'}
        </p>
      </header>

      {board.current ? (
        <Card className="space-y-4 p-6">
          <div className="flex flex-wrap items-start justify-between gap-4">
            <div>
              <p className="text-base uppercase tracking-wide text-ink-muted">On the dyno now</p>
              <h2 className="text-5xl font-bold leading-tight" data-testid="on-dyno">
                {board.current.bikeLabel}
              </h2>
              <p className="text-xl text-ink-muted">
                {board.current.customerName} · session of {formatDateTime(board.current.session.startedAt)} ·{' '}
                <Link className="text-accent underline" to={paths.session(board.current.session.id)}>
                  session page
                </Link>
              </p>
            </div>
            {canSet && (
              <Button size="lg" className="min-h-16 px-8 text-xl" loading={clear.isPending} onClick={() => clear.mutate(undefined, { onError: (e) => toast.error('The dyno was not cleared', { description: e.message }) })}>
                Clear dyno
              </Button>
            )}
          </div>
          <StagePicker board={board} canSet={canSet} />
          <SessionCautions board={board} canSet={canSet} />
        </Card>
      ) : (
        <Card className="space-y-4 p-6">
          <h2 className="text-3xl font-semibold" data-testid="on-dyno">
            Nothing on the dyno
          </h2>
          <p className="text-ink-muted">Files from this dyno’s PC wait in the inbox until a bike is set. Put a bike on with one tap:</p>
          <BayBikePicker dynoId={board.dyno.id} canSet={canSet} />
        </Card>
      )}

      {board.current && <Pulls board={board} />}

      <Caution title="In the bay">
        <ul>
          <li>Restraints and wheel chocks checked; nobody in line with the roller or the rear wheel.</li>
          <li>Cooling fan running, exhaust extraction on, hearing protection for everyone, extinguisher at hand.</li>
          <li>Watch engine temperature and mixture: leaner mixtures and more power raise cylinder-head temperatures.</li>
          <li>Follow the dyno maker’s manual, local workplace rules and licensed practice; they come before anything shown here.</li>
        </ul>
      </Caution>
    </div>
  );
}

function StagePicker({ board, canSet }: { board: BayBoardDto; canSet: boolean }) {
  const current = board.current!;
  const stages = useQuery(bayQueries.stages(current.bikeId));
  const set = useSetDynoCurrent(board.dyno.id);
  if (!stages.data?.length) return current.stage ? <p className="text-xl">Stage: {current.stage.name}</p> : null;
  const choose = (stageId: string | undefined) => set.mutate({ bikeId: current.bikeId, sessionId: current.session.id, stageId });
  return (
    <div className="flex flex-wrap items-center gap-2" role="group" aria-label="Stage of the pulls">
      <span className="mr-2 text-xl">Stage:</span>
      {[{ id: undefined, name: 'No stage' }, ...stages.data].map((s) => {
        const active = (current.stage?.id ?? undefined) === s.id;
        return (
          <Button key={s.id ?? 'none'} size="lg" variant={active ? 'primary' : 'secondary'} aria-pressed={active} disabled={!canSet} onClick={() => !active && choose(s.id)}>
            {s.name}
          </Button>
        );
      })}
    </div>
  );
}

function SessionCautions({ board, canSet }: { board: BayBoardDto; canSet: boolean }) {
  const session = board.current!.session;
  const confirm = useConfirmBaySafety(board.dyno.id);
  return (
    <>
      {!session.safetyConfirmedAt && (
        <Caution title="Bay checklist not confirmed for this session">
          <div className="flex flex-wrap items-end gap-4">
            <ul className="grid flex-1 gap-x-8 md:grid-cols-2">
              {SAFETY_CHECKS.map((c) => (
                <li key={c.id}>{c.label}</li>
              ))}
            </ul>
            {canSet && (
              <Button variant="primary" size="lg" loading={confirm.isPending} onClick={() => confirm.mutate(session.id)}>
                All six checks done
              </Button>
            )}
          </div>
        </Caution>
      )}
      {session.conditionsToConfirm && (
        <Caution kind="notice" title="Conditions to confirm">
          No measured temperature, pressure or humidity yet (the shop’s default correction is used): enter them on the{' '}
          <Link className="text-accent underline" to={paths.session(session.id)}>
            session page
          </Link>
          .
        </Caution>
      )}
    </>
  );
}

const hp = (v: number | null) => (v === null ? '—' : formatNumber(v, { decimals: 1 }));

function Pulls({ board }: { board: BayBoardDto }) {
  const pulls = board.pulls;
  const latest: BayPullDto | undefined = [...pulls].reverse().find((p) => p.curve) ?? pulls[pulls.length - 1];
  if (!pulls.length) return <EmptyState title="No pulls yet in this session" message="Each file the dyno saves appears here within seconds." />;
  return (
    <>
      <section className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4" aria-label="Latest pull">
        <Figure label={`Pull ${latest?.run.sequence ?? ''} peak power`} value={`${hp(latest?.peakPowerHp ?? null)} hp`} />
        <Figure label="Peak torque" value={`${hp(latest?.peakTorqueLbft ?? null)} lb·ft`} />
        <Figure label={board.reference ? `Gain over ${board.reference.kind === 'baseline' ? 'baseline' : 'reference'}` : 'Gain'} value={latest?.gain ? formatGain(latest.gain.peakPowerHp) : '—'} detail={latest?.gain ? `average ${formatGain(latest.gain.averagePowerHp)} over the common range` : board.reference ? 'this is the reference pull' : 'no reference run yet'} />
        <Figure label={board.spread?.stageName ? `Spread · ${board.spread.stageName}` : 'Spread'} value={board.spread ? board.spread.text : '—'} detail={board.spread ? 'range of peak power' : 'needs two readable pulls'} />
      </section>
      <Card className="p-4">
        <p className="mb-2 text-ink-muted">{board.reference ? `Grey: ${board.reference.label}` : 'No reference run yet: the first readable pull becomes the baseline.'}</p>
        <BayChart pulls={pulls} reference={board.reference?.pull ?? null} referenceLabel={board.reference?.label ?? null} />
      </Card>
      <Card className="overflow-x-auto p-0">
        <table className="w-full text-left text-xl">
          <caption className="sr-only">Pulls of this session</caption>
          <thead className="text-base text-ink-muted">
            <tr>
              <th className="px-4 py-3">Pull</th>
              <th className="px-4 py-3">File</th>
              <th className="px-4 py-3 text-right">Peak hp</th>
              <th className="px-4 py-3 text-right">Peak lb·ft</th>
              <th className="px-4 py-3 text-right">Gain</th>
            </tr>
          </thead>
          <tbody>
            {[...pulls].reverse().map((p) => (
              <tr key={p.run.id} className="border-t border-line" data-testid="bay-pull" data-run-id={p.run.id}>
                <td className="num px-4 py-3 font-semibold">
                  <Link className="text-accent underline" to={paths.run(p.run.id)}>
                    {p.run.sequence}
                  </Link>
                </td>
                <td className="px-4 py-3">
                  {p.run.originalName}
                  {p.run.pullCount > 1 && <span className="text-ink-muted"> · pull {p.run.pullIndex + 1} of {p.run.pullCount}</span>}
                  {p.run.status !== 'ready' && <Badge tone="warn">{p.run.status === 'needs-mapping' ? 'Needs mapping' : 'Not readable'}</Badge>}
                </td>
                <td className="num px-4 py-3 text-right font-semibold">{hp(p.peakPowerHp)}</td>
                <td className="num px-4 py-3 text-right">{hp(p.peakTorqueLbft)}</td>
                <td className="num px-4 py-3 text-right">{p.gain ? formatGain(p.gain.peakPowerHp) : p.run.id === board.reference?.pull.run.id ? 'reference' : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Card>
    </>
  );
}

function Figure({ label, value, detail }: { label: string; value: string; detail?: string }) {
  return (
    <Card className="p-5">
      <p className="text-base text-ink-muted">{label}</p>
      <p className="num text-5xl font-bold leading-tight">{value}</p>
      {detail && <p className="text-base text-ink-muted">{detail}</p>}
    </Card>
  );
}
