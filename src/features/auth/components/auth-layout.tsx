import type { ReactNode } from 'react';
import { PRODUCT_NAME, usePageTitle } from '@/lib/page-title';

/** The frame of the signed-out pages: the name, one card, nothing else to distract. */
export function AuthLayout({ title, subtitle, children, footer }: { title: string; subtitle?: ReactNode; children: ReactNode; footer?: ReactNode }) {
  usePageTitle(title, PRODUCT_NAME);
  return (
    <div className="flex min-h-screen flex-col items-center bg-paper px-4 py-10 md:justify-center">
      <main className="w-full max-w-md">
        <div className="mb-6 flex items-center gap-2 text-lg font-semibold text-ink">
          <img src="/favicon.svg" alt="" className="h-8 w-8" />
          <span>Pullbook</span>
        </div>
        <section aria-labelledby="auth-title" className="rounded-card border border-line bg-paper-raised p-6 shadow-card">
          <h1 id="auth-title" className="text-2xl font-bold text-ink">
            {title}
          </h1>
          {subtitle != null && <p className="mt-1 text-ink-muted">{subtitle}</p>}
          <div className="mt-5">{children}</div>
        </section>
        {footer != null && <div className="mt-4 text-center text-sm text-ink-muted">{footer}</div>}
      </main>
    </div>
  );
}

/** Only same-site paths are followed after sign-in, so a crafted ?next= cannot send people elsewhere. */
export function safeNext(next: string | null): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  return next;
}
