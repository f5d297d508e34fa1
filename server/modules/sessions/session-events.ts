/**
 * GET /api/sessions/:id/events: Server-Sent Events for the bay board. One `run` event per new or
 * changed run of the session (from PostgreSQL NOTIFY, so any app instance's change arrives), a
 * `resync` event after the listening connection was lost and regained, and a heartbeat comment
 * every 15 s so proxies keep the connection open. Cleaned up when the client goes away.
 */
import type { Request, Response } from 'express';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { Actor } from '../../http/actor';
import type { AppDeps } from '../../app-deps';
import { liveFeedFor } from '../../lib/live/live-feed';
import { getSessionEntity } from './session.service';

export const HEARTBEAT_MS = 15_000;

export async function streamSessionEvents(ctx: { em: EntityManager; actor: Actor; deps: AppDeps; req: Request; res: Response; sessionId: string }): Promise<void> {
  const { em, actor, deps, req, res } = ctx;
  const session = await getSessionEntity(em, actor, ctx.sessionId); // 404 before any byte is sent
  const feed = liveFeedFor(deps, deps.config.DATABASE_URL);
  // no-transform: the compression middleware leaves the stream alone (it would hold events back).
  res.status(200).set({ 'Content-Type': 'text/event-stream; charset=utf-8', 'Cache-Control': 'no-cache, no-transform', Connection: 'keep-alive', 'X-Accel-Buffering': 'no' });
  res.flushHeaders();
  res.write('retry: 3000\n\n');
  let seq = 0;
  const unsubscribe = feed.subscribe(session.id, (e) => {
    if (e.kind === 'resync') res.write(`event: resync\ndata: {}\n\n`);
    else if (e.notice.shopId === actor.shopId) res.write(`event: run\nid: ${++seq}\ndata: ${JSON.stringify({ runId: e.notice.runId, sessionId: e.notice.sessionId, op: e.notice.op })}\n\n`);
  });
  const heartbeat = setInterval(() => res.write(': heartbeat\n\n'), HEARTBEAT_MS);
  heartbeat.unref();
  const closed = new Promise<void>((resolve) => {
    req.once('close', resolve);
    res.once('close', resolve);
  });
  // Tell the client once events can arrive (LISTEN active), so nothing committed after this is missed.
  if (await feed.ready()) res.write(': listening\n\n');
  await closed;
  clearInterval(heartbeat);
  unsubscribe();
}
