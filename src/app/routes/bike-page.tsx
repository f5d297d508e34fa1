import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router-dom';
import { STAFF } from '@shared/roles';
import { Button, EmptyState, ErrorState, Icon, LoadingState, PageHeader } from '@/components/ui';
import { ApiError } from '@/lib/api-client';
import { hasRole, useCurrentUser } from '@/lib/auth';
import { paths } from '@/config/paths';
import { BikeDetailsCard, BikeFormDialog, BikeStageGains, bikeQueries } from '@/features/bikes';
import { BikeBuildTimeline, BikeRunsSection } from '@/features/runs';
import { BikeReportsSection } from '@/features/reports';
import { SimilarBuilds, TypicalOutcomePanel } from '@/features/finder';
import { PutOnDyno } from '@/features/dynos';
import { BikePlansSection } from '@/features/plans';
import { bikeLabel } from '@shared/labels';
import { usePageTitle } from '@/lib/page-title';

/**
 * The bike page: the bike's identity first, then everything the archive holds about it.
 * Staff see the owner as a link; customers (their own bikes only) see it read-only.
 */
export function BikePage() {
  const { bikeId = '' } = useParams();
  const user = useCurrentUser();
  const isStaff = hasRole(user, STAFF);
  const canEdit = hasRole(user, ['owner', 'desk']);
  const bike = useQuery(bikeQueries.detail(bikeId));
  usePageTitle(bike.data ? bikeLabel(bike.data) : 'Bike');
  const [editing, setEditing] = useState(false);

  if (bike.isPending) return <LoadingState message="Loading the bike…" />;
  if (bike.isError) {
    if (bike.error instanceof ApiError && (bike.error.status === 404 || bike.error.status === 400)) {
      return (
        <EmptyState
          headingLevel={1}
          title="No such bike"
          message="This bike is not on file, or it is not one you can see."
          action={
            <Link className="text-accent underline" to={isStaff ? paths.bikes : paths.home}>
              {isStaff ? 'All bikes' : 'My bikes'}
            </Link>
          }
        />
      );
    }
    return <ErrorState error={bike.error} onRetry={() => bike.refetch()} isRetrying={bike.isFetching} />;
  }
  const b = bike.data;
  const title = bikeLabel(b);

  return (
    <>
      <PageHeader
        back={
          <Link to={isStaff ? paths.bikes : paths.home} className="focus-ring inline-flex items-center gap-1 rounded-control text-ink-muted hover:text-ink">
            <Icon name="chevron-left" size={16} /> {isStaff ? 'All bikes' : 'My bikes'}
          </Link>
        }
        title={title}
        subtitle={isStaff ? `Owned by ${b.customerName}` : undefined}
        secondaryActions={<>{isStaff && <PutOnDyno bikeId={b.id} />}{canEdit && <Button onClick={() => setEditing(true)}>Edit bike</Button>}</>}
      />
      <BikeDetailsCard bike={b} linkCustomer={isStaff} />

      {/* Everything the archive holds about the bike, each section from its own feature. */}
      <div className="mt-6 space-y-6">
        {/* Gains and cost per hp live in one place (Gains by stage); Stages and parts is the editing view. */}
        <BikeStageGains bikeId={b.id} />
        <BikeBuildTimeline bikeId={b.id} />
        <BikeRunsSection bikeId={b.id} />
        <BikeReportsSection bikeId={b.id} />
        <BikePlansSection bikeId={b.id} />
        {isStaff && (
          <div className="grid gap-6 lg:grid-cols-2">
            <TypicalOutcomePanel bikeId={b.id} />
            <SimilarBuilds bikeId={b.id} />
          </div>
        )}
      </div>

      {canEdit && <BikeFormDialog open={editing} bike={b} onClose={() => setEditing(false)} />}
    </>
  );
}
