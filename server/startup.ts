import type { AppDeps } from './app-deps';

/**
 * Work done once when a server starts (after migrations, before listening), e.g. removing
 * objects whose database rows never committed. Each task logs and never blocks the start.
 */
export type StartupTask = { name: string; run: (deps: AppDeps) => Promise<string | void> };

const tasks: StartupTask[] = [];

export function registerStartupTask(task: StartupTask) {
  tasks.push(task);
}

export async function runStartupTasks(deps: AppDeps) {
  for (const task of tasks) {
    try {
      const note = await task.run(deps);
      if (note) console.log(`[pullbook] ${task.name}: ${note}`);
    } catch (err) {
      console.error(`[pullbook] start-up task ${task.name} failed:`, err);
    }
  }
}
