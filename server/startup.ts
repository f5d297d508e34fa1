import type { AppDeps } from './app-deps';
import { logger } from './lib/logger';

/**
 * Work done once when a server starts (after migrations, before listening), e.g. removing
 * objects whose database rows never committed. Each task logs and never blocks the start.
 * The tasks are listed by name in server/startup-tasks.ts; nothing registers itself by being imported.
 */
export type StartupTask = { name: string; run: (deps: AppDeps) => Promise<string | void> };

/** Runs the given tasks one after another, in list order; a failing task is logged and the next one runs. */
export async function runStartupTasks(deps: AppDeps, tasks: readonly StartupTask[]) {
  for (const task of tasks) {
    try {
      const note = await task.run(deps);
      if (note) logger.info({ task: task.name }, note);
    } catch (err) {
      logger.error({ err, task: task.name }, 'start-up task failed');
    }
  }
}
