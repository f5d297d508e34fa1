/** A class-name value: strings join, falsy values drop out, objects keep keys whose value is truthy. */
export type ClassValue = string | number | false | null | undefined | ClassValue[] | Record<string, unknown>;

/** Join class names: `cn('px-2', isActive && 'bg-accent', { 'opacity-50': disabled })`. */
export function cn(...inputs: ClassValue[]): string {
  const out: string[] = [];
  const add = (value: ClassValue): void => {
    if (!value && value !== 0) return;
    if (typeof value === 'string' || typeof value === 'number') {
      out.push(String(value));
    } else if (Array.isArray(value)) {
      value.forEach(add);
    } else {
      for (const [key, on] of Object.entries(value)) if (on) out.push(key);
    }
  };
  inputs.forEach(add);
  return out.join(' ');
}
