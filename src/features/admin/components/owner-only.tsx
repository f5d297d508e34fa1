import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { EmptyState } from '@/components/ui';
import { SIGNED_IN_AS, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { usePageTitle } from '@/lib/page-title';

/** Settings pages are the owner's. Others who land here (an old link, a typed address) are told so plainly. */
export function OwnerOnly({ children }: { children: ReactNode }) {
  const user = useCurrentUser();
  if (user.role === 'owner') return <>{children}</>;
  return <NotTheOwner role={user.role} />;
}

/** The refusal as a page of its own: its own tab title and heading. */
function NotTheOwner({ role }: { role: keyof typeof SIGNED_IN_AS }) {
  usePageTitle('Not for your role');
  return (
    <EmptyState
      headingLevel={1}
      icon="circle-info"
      title="Not for your role"
      message={`This page is for the shop owner; you are signed in as ${SIGNED_IN_AS[role]}. Ask the owner if something here needs changing.`}
      action={
        <Link to={paths.home} className="text-accent underline">
          Go to the start page
        </Link>
      }
    />
  );
}
