/** Class strings shared by several controls, so fields, buttons and search look alike. */

/** Text-like inputs, selects and text areas. 44 px tall: comfortable for a gloved finger at the dyno. */
export const controlClass =
  'block w-full min-h-11 rounded-control border border-line-strong bg-paper-raised px-3 py-2 text-base text-ink ' +
  'placeholder:text-ink-subtle transition-colors ' +
  'focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-focus focus-visible:border-accent ' +
  'disabled:cursor-not-allowed disabled:bg-paper-sunk disabled:text-ink-subtle ' +
  'aria-[invalid=true]:border-loss aria-[invalid=true]:border-2';

export const labelClass = 'block text-sm font-semibold text-ink';
export const hintClass = 'mt-1 text-sm text-ink-subtle';
export const errorTextClass = 'mt-1 flex items-start gap-1 text-sm font-medium text-loss';

export type Tone = 'neutral' | 'accent' | 'gain' | 'loss' | 'warn' | 'info';

/** Soft background + strong text for each tone (all text pairs ≥ 4.5:1). */
export const toneSoftClass: Record<Tone, string> = {
  neutral: 'bg-paper-sunk text-ink-muted border-line',
  accent: 'bg-accent-soft text-accent border-accent/30',
  gain: 'bg-gain-soft text-gain border-gain/30',
  loss: 'bg-loss-soft text-loss border-loss/30',
  warn: 'bg-warn-soft text-warn border-warn/30',
  info: 'bg-info-soft text-info border-info/30',
};

export type ButtonVariant = 'primary' | 'secondary' | 'ghost' | 'danger';
export type ButtonSize = 'sm' | 'md' | 'lg';

export const buttonVariantClass: Record<ButtonVariant, string> = {
  primary: 'bg-accent text-white hover:bg-accent-hover active:bg-accent-active border border-transparent',
  secondary: 'bg-paper-raised text-ink border border-line-strong hover:bg-paper-sunk active:bg-line',
  ghost: 'bg-transparent text-ink border border-transparent hover:bg-paper-sunk active:bg-line',
  danger: 'bg-loss text-white hover:bg-loss-hover border border-transparent',
};

export const buttonSizeClass: Record<ButtonSize, string> = {
  sm: 'min-h-11 px-3 text-sm gap-1.5',
  md: 'min-h-11 px-4 text-base gap-2',
  lg: 'min-h-12 px-5 text-lg gap-2',
};

export const buttonBaseClass =
  'inline-flex items-center justify-center rounded-control font-semibold select-none whitespace-nowrap ' +
  'transition-colors focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-focus ' +
  'disabled:cursor-not-allowed disabled:opacity-55 aria-busy:cursor-progress';
