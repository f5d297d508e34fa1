import { describe, expect, it } from 'vitest';
import { priorityClass } from '@/components/ui/DataTable';

// Our own rule (no outside source): extras hide below Tailwind's lg breakpoint (1024 px, so on a
// 768 px tablet) until "All columns" is pressed; the first key column sticks to the left edge.
describe('DataTable column priority', () => {
  it('hides extra columns on a tablet unless every column is asked for', () => {
    expect(priorityClass('extra', { showExtras: false, sticky: false, header: false })).toContain('max-lg:hidden');
    expect(priorityClass('extra', { showExtras: true, sticky: false, header: false })).not.toContain('hidden');
  });
  it('keeps the first key column in place, over the cells that scroll under it', () => {
    const cell = priorityClass('key', { showExtras: false, sticky: true, header: false });
    expect(cell).toContain('sticky left-0');
    expect(cell).toContain('bg-paper-raised');
    expect(priorityClass('key', { showExtras: false, sticky: true, header: true })).toContain('z-20');
    expect(priorityClass('key', { showExtras: false, sticky: false, header: false })).toBe('');
    expect(priorityClass(undefined, { showExtras: false, sticky: false, header: false })).toBe('');
  });
});
