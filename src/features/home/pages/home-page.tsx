import { lazy, Suspense, type ReactNode } from 'react';
import { LoadingState } from '@/components/ui';
import { useCurrentUser } from '@/lib/auth';

const TodayPage = lazy(() => import('./today-page'));
const MyBikesPage = lazy(() => import('./my-bikes-page'));

/**
 * The start page: Today for staff, My bikes for customers. `customerExtras` is where the app
 * adds other features' sections for customers (their reports), since features do not import
 * each other.
 */
export function HomePage({ customerExtras }: { customerExtras?: ReactNode }) {
  const user = useCurrentUser();
  return (
    <Suspense fallback={<LoadingState />}>
      {user.role === 'customer' ? (
        <>
          <MyBikesPage />
          {customerExtras && <div className="mt-8">{customerExtras}</div>}
        </>
      ) : (
        <TodayPage />
      )}
    </Suspense>
  );
}
