import { computed, ref, watch } from 'vue';
import { useRoute, useRouter, type LocationQuery } from 'vue-router';
import { batchKindSchema, stageSchema, type BatchKind, type Stage } from '@shared/schemas/batches';
import { fetchBatches, type BatchPage } from '@/api/batches';
import { useSessionStore } from '@/stores/session';

export const BATCH_SORTS = ['started-desc', 'started-asc', 'name'] as const;
export type BatchSort = (typeof BATCH_SORTS)[number];

/** The Batches list's filters, as they stand in the URL so a filtered view can be bookmarked. */
export interface BatchFilters {
  q: string;
  stage: Stage | null;
  kind: BatchKind | null;
  agedMonths: number | null;
  needsRacking: boolean;
  sort: BatchSort;
  page: number;
  pageSize: number;
}

export const DEFAULT_PAGE_SIZE = 25;
const one = (value: LocationQuery[string]) => (Array.isArray(value) ? value[0] : value) ?? undefined;
const wholeNumber = (value: string | undefined, min: number, max: number) => {
  const n = Number(value);
  return Number.isInteger(n) && n >= min && n <= max ? n : null;
};

/** Filters from a route query; anything malformed falls back to its default. */
export function filtersFromQuery(query: LocationQuery): BatchFilters {
  const sort = one(query.sort);
  return {
    q: one(query.q) ?? '',
    stage: stageSchema.safeParse(one(query.stage)).data ?? null,
    kind: batchKindSchema.safeParse(one(query.kind)).data ?? null,
    agedMonths: wholeNumber(one(query.agedMonths) ?? undefined, 1, 240),
    needsRacking: one(query.needsRacking) === 'true',
    sort: (BATCH_SORTS as readonly string[]).includes(sort ?? '') ? (sort as BatchSort) : 'started-desc',
    page: wholeNumber(one(query.page) ?? undefined, 1, 100000) ?? 1,
    pageSize: wholeNumber(one(query.pageSize) ?? undefined, 1, 200) ?? DEFAULT_PAGE_SIZE,
  };
}

/** The route query for some filters, leaving defaults out so URLs stay short. */
export function queryFromFilters(f: BatchFilters): Record<string, string> {
  const query: Record<string, string> = {};
  if (f.q.trim()) query.q = f.q.trim();
  if (f.stage) query.stage = f.stage;
  if (f.kind) query.kind = f.kind;
  if (f.agedMonths) query.agedMonths = String(f.agedMonths);
  if (f.needsRacking) query.needsRacking = 'true';
  if (f.sort !== 'started-desc') query.sort = f.sort;
  if (f.page > 1) query.page = String(f.page);
  if (f.pageSize !== DEFAULT_PAGE_SIZE) query.pageSize = String(f.pageSize);
  return query;
}

/** True when any filter narrows the list (the search text counts). */
export const isFiltered = (f: BatchFilters) => !!(f.q.trim() || f.stage || f.kind || f.agedMonths || f.needsRacking);

/** One page of batches for the filters in the URL, reloaded whenever they change. */
export function useBatchList() {
  const route = useRoute();
  const router = useRouter();
  const session = useSessionStore();
  const filters = computed(() => filtersFromQuery(route.query));
  const result = ref<BatchPage | null>(null);
  const loading = ref(false);
  const error = ref<string | null>(null);
  let latest = 0;

  async function load(): Promise<void> {
    const ticket = ++latest;
    const f = filters.value;
    loading.value = true;
    error.value = null;
    try {
      const page = await fetchBatches(session.currentCellarId ?? '', {
        q: f.q.trim() || undefined,
        stage: f.stage ?? undefined,
        kind: f.kind ?? undefined,
        agedMonths: f.agedMonths ?? undefined,
        needsRacking: f.needsRacking ? 'true' : undefined,
        sort: f.sort,
        page: f.page,
        pageSize: f.pageSize,
      });
      if (ticket === latest) result.value = page;
    } catch (err) {
      if (ticket === latest) error.value = err instanceof Error ? err.message : 'Could not load the batches.';
    } finally {
      if (ticket === latest) loading.value = false;
    }
  }

  /** Changes filters in the URL; any change but paging goes back to page 1. */
  function update(patch: Partial<BatchFilters>): void {
    const next = { ...filters.value, page: 1, ...patch };
    void router.replace({ query: queryFromFilters(next) });
  }

  watch(
    () => (route.name === 'batches' ? JSON.stringify(filters.value) : null),
    (key) => key !== null && void load(),
    { immediate: true },
  );

  return { filters, result, loading, error, update, reload: load };
}
