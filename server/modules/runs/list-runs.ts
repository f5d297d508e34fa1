/** The run list: filters, search, sort and page over the runs the actor may see. */
import type { EntityManager } from '@mikro-orm/postgresql';
import type { FilterQuery } from '@mikro-orm/core';
import type { z } from 'zod';
import type { Actor } from '../../http/actor';
import { containsPattern } from '../../db/sql-text';
import { parseSort, type Page } from '@shared/schemas/common';
import type { RunSummaryDto, runListQuery } from '@shared/schemas/run';
import { Run } from './run.entity';
import { RUN_POPULATE, toRunSummaries } from './run-dto';
import { runScope } from './run-scope';

export type RunListQuery = z.output<typeof runListQuery>;

/** Deleted runs are listed only for an owner who asks (`includeDeleted=true`). */
export async function listRuns(em: EntityManager, actor: Actor, query: RunListQuery): Promise<Page<RunSummaryDto>> {
  const where = { ...(runScope(actor, { includeDeleted: query.includeDeleted === true && actor.role === 'owner' }) as Record<string, unknown>) };
  const and: Record<string, unknown>[] = [];
  if (query.bikeId) and.push({ bike: query.bikeId });
  if (query.customerId) and.push({ bike: { customer: query.customerId } });
  if (query.stageId) and.push({ stage: query.stageId });
  if (query.sessionId) and.push({ session: query.sessionId });
  if (query.status) and.push({ status: query.status });
  if (query.tag) and.push({ tags: { $contains: [query.tag] } });
  if (query.from) and.push({ createdAt: { $gte: new Date(`${query.from}T00:00:00Z`) } });
  if (query.to) and.push({ createdAt: { $lt: new Date(new Date(`${query.to}T00:00:00Z`).getTime() + 86_400_000) } });
  if (query.q) {
    const like = containsPattern(query.q);
    and.push({
      $or: [
        { originalName: { $ilike: like } },
        { label: { $ilike: like } },
        { note: { $ilike: like } },
        { bike: { make: { $ilike: like } } },
        { bike: { model: { $ilike: like } } },
        { bike: { customer: { name: { $ilike: like } } } },
        { stage: { name: { $ilike: like } } },
      ],
    });
  }
  if (and.length) where.$and = and;
  const { field, dir } = parseSort(query.sort, '-createdAt');
  const order = field === 'createdAt' ? dir : (`${dir} nulls last` as const);
  const [rows, total] = await em.findAndCount(Run, where as FilterQuery<Run>, {
    populate: RUN_POPULATE as never,
    orderBy: [{ [field]: order }, { createdAt: 'desc' }, { id: 'asc' }],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  return { items: await toRunSummaries(em, rows), total, page: query.page, pageSize: query.pageSize };
}
