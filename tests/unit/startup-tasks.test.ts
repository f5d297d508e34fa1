import { afterEach, describe, expect, it, vi } from 'vitest';
import { runStartupTasks, type StartupTask } from '@server/startup';
import { STARTUP_TASKS } from '@server/startup-tasks';
import type { AppDeps } from '@server/app-deps';
import { logger } from '@server/lib/logger';

afterEach(() => vi.restoreAllMocks());

describe('start-up tasks', () => {
  it('are named explicitly in one list (the orphan-object reconciliation today)', () => {
    expect(STARTUP_TASKS.map((t) => t.name)).toEqual(['orphan objects']);
  });

  it('run one after another in list order; a failing task is logged and the next one still runs', async () => {
    const log = vi.spyOn(logger, 'info').mockImplementation(() => undefined);
    const error = vi.spyOn(logger, 'error').mockImplementation(() => undefined);
    const order: string[] = [];
    const task = (name: string, fail = false): StartupTask => ({
      name,
      async run() {
        // A later task must not start before an earlier one ends.
        await new Promise((r) => setTimeout(r, name === 'first' ? 20 : 0));
        order.push(name);
        if (fail) throw new Error('boom');
        return `${name} done`;
      },
    });
    await runStartupTasks({} as AppDeps, [task('first'), task('second', true), task('third')]);
    expect(order).toEqual(['first', 'second', 'third']);
    // One structured line per task that has something to say: the task's name and its note.
    expect(log.mock.calls.map((c) => [c[0], c[1]])).toEqual([
      [{ task: 'first' }, 'first done'],
      [{ task: 'third' }, 'third done'],
    ]);
    expect(error).toHaveBeenCalledTimes(1);
    expect(error.mock.calls[0][0]).toMatchObject({ task: 'second' });
  });
});
