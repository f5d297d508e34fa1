/**
 * Every query key of the client, one factory per API resource and each key written once. Keys are
 * rooted by the resource (['runs', …], ['bikes', …], ['comparisons', …]), never by the screen that
 * reads them, so a mutation in one feature can refresh what another feature shows without importing
 * it (features never import each other; they all import src/lib). The features' `xQueries` build
 * queryOptions on these keys; mutations name the keys they change in their own file.
 *
 * A key holds one data shape: a Page<T> list and a plain T[] look-up of the same resource take
 * different keys ('list' and 'options').
 */

/** Filters are part of the key as an object; TanStack Query hashes it by value. */
type Filters = object;

export const runKeys = {
  all: () => ['runs'] as const,
  lists: () => [...runKeys.all(), 'list'] as const,
  list: (filters: Filters) => [...runKeys.lists(), filters] as const,
  details: () => [...runKeys.all(), 'detail'] as const,
  detail: (id: string) => [...runKeys.details(), id] as const,
  /** The first rows of a kept file, to map its columns by hand. */
  preview: (id: string) => [...runKeys.all(), 'preview', id] as const,
};

export const sessionKeys = {
  all: () => ['sessions'] as const,
  lists: () => [...sessionKeys.all(), 'list'] as const,
  list: (bikeId: string) => [...sessionKeys.lists(), { bikeId }] as const,
  details: () => [...sessionKeys.all(), 'detail'] as const,
  detail: (id: string) => [...sessionKeys.details(), id] as const,
};

export const stageKeys = {
  all: () => ['stages'] as const,
  lists: () => [...stageKeys.all(), 'list'] as const,
  list: (bikeId: string) => [...stageKeys.lists(), { bikeId }] as const,
};

export const bikeKeys = {
  all: () => ['bikes'] as const,
  /** Pages of bikes (Page<BikeDto>). */
  lists: () => [...bikeKeys.all(), 'list'] as const,
  list: (filters: Filters) => [...bikeKeys.lists(), filters] as const,
  /** Bikes to pick from (BikeDto[]). */
  options: (filters: Filters) => [...bikeKeys.all(), 'options', filters] as const,
  details: () => [...bikeKeys.all(), 'detail'] as const,
  detail: (id: string) => [...bikeKeys.details(), id] as const,
  engineFamilies: () => [...bikeKeys.all(), 'engine-families'] as const,
};

export const customerKeys = {
  all: () => ['customers'] as const,
  /** Pages of customers (Page<CustomerDto>). */
  lists: () => [...customerKeys.all(), 'list'] as const,
  list: (filters: Filters) => [...customerKeys.lists(), filters] as const,
  /** Customers to pick from (CustomerDto[]). */
  options: (filters: Filters) => [...customerKeys.all(), 'options', filters] as const,
  details: () => [...customerKeys.all(), 'detail'] as const,
  detail: (id: string) => [...customerKeys.details(), id] as const,
  /** A customer's bikes; under the customer, as bike changes change what the customer page shows. */
  bikes: (id: string) => [...customerKeys.detail(id), 'bikes'] as const,
};

export const comparisonKeys = {
  all: () => ['comparisons'] as const,
  lists: () => [...comparisonKeys.all(), 'list'] as const,
  list: (filters: Filters) => [...comparisonKeys.lists(), filters] as const,
  details: () => [...comparisonKeys.all(), 'detail'] as const,
  detail: (id: string) => [...comparisonKeys.details(), id] as const,
  previews: () => [...comparisonKeys.all(), 'preview'] as const,
  preview: (input: Filters) => [...comparisonKeys.previews(), input] as const,
  /** A bike's gains by stage (the build timeline). */
  timelines: () => [...comparisonKeys.all(), 'timeline'] as const,
  timeline: (bikeId: string) => [...comparisonKeys.timelines(), bikeId] as const,
  /** Runs of a bike offered for a comparison. */
  candidatesAll: () => [...comparisonKeys.all(), 'candidates'] as const,
  candidates: (bikeId: string) => [...comparisonKeys.candidatesAll(), bikeId] as const,
};

export const reportKeys = {
  all: () => ['reports'] as const,
  lists: () => [...reportKeys.all(), 'list'] as const,
  list: (filters: Filters) => [...reportKeys.lists(), filters] as const,
  detail: (id: string) => [...reportKeys.all(), 'detail', id] as const,
  deliveries: (id: string) => [...reportKeys.all(), 'deliveries', id] as const,
  shares: (id: string) => [...reportKeys.all(), 'shares', id] as const,
  /** A report as a share link shows it to anyone holding the token. */
  publicShare: (token: string) => [...reportKeys.all(), 'public-share', token] as const,
};

/** The build finder's reads (server module builds). */
export const buildKeys = {
  all: () => ['builds'] as const,
  search: (filters: Filters) => [...buildKeys.all(), 'search', filters] as const,
  similar: (bikeId: string) => [...buildKeys.all(), 'similar', bikeId] as const,
  typical: (bikeId: string, category: string, level: string) => [...buildKeys.all(), 'typical', bikeId, category, level] as const,
};

/** The caller's shop: one entry every screen shares (header name, units, settings). */
export const shopKeys = {
  all: () => ['shop'] as const,
};

export const authKeys = {
  all: () => ['auth'] as const,
  me: () => [...authKeys.all(), 'me'] as const,
  token: (token: string) => [...authKeys.all(), 'token', token] as const,
};

export const userKeys = {
  all: () => ['users'] as const,
};

export const auditKeys = {
  all: () => ['audit'] as const,
  list: (kinds: string) => [...auditKeys.all(), kinds] as const,
};

export const outboxKeys = {
  all: () => ['outbox'] as const,
  list: () => [...outboxKeys.all(), 'list'] as const,
  message: (id: string) => [...outboxKeys.all(), 'message', id] as const,
  /** The send log (queued, sent, failed), whatever relay sends the mail. */
  log: () => [...outboxKeys.all(), 'log'] as const,
};

export const dynoKeys = {
  all: () => ['dynos'] as const,
  list: () => [...dynoKeys.all(), 'list'] as const,
  tokens: (dynoId: string) => [...dynoKeys.all(), 'tokens', dynoId] as const,
  /** A dyno's bay board; refreshed by the session's live events (and by any change to runs). */
  board: (dynoId: string) => [...dynoKeys.all(), 'board', dynoId] as const,
};

/** Run files from a dyno with nothing on it, waiting for a bike. */
export const inboxKeys = {
  all: () => ['inbox'] as const,
  list: () => [...inboxKeys.all(), 'list'] as const,
};

/** Build plans: a bike's list, one plan, a plan opened from its link. */
export const planKeys = {
  all: () => ['plans'] as const,
  bike: (bikeId: string) => [...planKeys.all(), 'bike', bikeId] as const,
  detail: (id: string) => [...planKeys.all(), 'detail', id] as const,
  versions: (id: string) => [...planKeys.all(), 'versions', id] as const,
  link: (token: string) => [...planKeys.all(), 'link', token] as const,
};
