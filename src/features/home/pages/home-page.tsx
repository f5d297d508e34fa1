import { lazy, Suspense } from 'react';
import { LoadingState } from '@/components/ui';
import { useCurrentUser } from '@/lib/auth';

const TodayPage = lazy(() => import('./today-page'));
const MyBikesPage = lazy(() => import('./my-bikes-page'));

/** "/" is the staff's Today page and a customer's My bikes; each loads only its own code. */
export default function HomePage() {
  const user = useCurrentUser();
  return <Suspense fallback={<LoadingState />}>{user.role === 'customer' ? <MyBikesPage /> : <TodayPage />}</Suspense>;
}
