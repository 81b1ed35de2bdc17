import { computed } from 'vue';
import { useRoute, useRouter, type LocationQuery } from 'vue-router';
import { VESSEL_STATES, type VesselState } from '@shared/schemas/vessels';

/** The Vessels page's filters, as kept in the URL. */
export interface VesselFilters {
  q: string;
  state: VesselState | null;
  freeAndSanitised: boolean;
  /** Always litres, whatever the user types in. */
  minCapacityL: number | null;
  /** Exactly this capacity, in litres (from Today's size tiles). */
  capacityL?: number | null;
  rackId: string | null;
}

export const DEFAULT_PAGE_SIZE = 25;

const text = (value: LocationQuery[string]) => (typeof value === 'string' ? value : '');
const positive = (value: LocationQuery[string]) => {
  const n = Number(text(value));
  return text(value) !== '' && Number.isFinite(n) && n > 0 ? n : null;
};

/**
 * Reads and writes the Vessels page's filters and page in the URL query, so a filtered list
 * can be bookmarked, shared and survives reloads and the back button.
 */
export function useVesselListQuery() {
  const route = useRoute();
  const router = useRouter();

  const filters = computed<VesselFilters>(() => {
    const state = text(route.query.state);
    return {
      q: text(route.query.q),
      state: (VESSEL_STATES as readonly string[]).includes(state) ? (state as VesselState) : null,
      // `freeAndSanitised` is the API's name for it; links may carry either.
      freeAndSanitised: route.query.free === 'true' || route.query.freeAndSanitised === 'true',
      minCapacityL: positive(route.query.min),
      capacityL: positive(route.query.cap),
      rackId: text(route.query.rack) || null,
    };
  });
  const page = computed(() => Math.max(1, Math.floor(positive(route.query.page) ?? 1)));
  const pageSize = computed(() => Math.min(200, Math.floor(positive(route.query.size) ?? DEFAULT_PAGE_SIZE)));

  function write(next: VesselFilters, nextPage: number, nextSize: number) {
    const query: Record<string, string> = {};
    if (next.q) query.q = next.q;
    if (next.state) query.state = next.state;
    if (next.freeAndSanitised) query.free = 'true';
    if (next.minCapacityL) query.min = String(Number(next.minCapacityL.toFixed(3)));
    if (next.capacityL) query.cap = String(next.capacityL);
    if (next.rackId) query.rack = next.rackId;
    if (nextPage > 1) query.page = String(nextPage);
    if (nextSize !== DEFAULT_PAGE_SIZE) query.size = String(nextSize);
    void router.replace({ query });
  }

  return {
    filters,
    page,
    pageSize,
    /** New filters start again at page 1. */
    setFilters: (next: VesselFilters) => write(next, 1, pageSize.value),
    setPage: (nextPage: number, nextSize = pageSize.value) => write(filters.value, nextPage, nextSize),
    /** The list request for the API. */
    apiQuery: computed(() => ({
      q: filters.value.q || undefined,
      state: filters.value.state ?? undefined,
      freeAndSanitised: filters.value.freeAndSanitised ? ('true' as const) : undefined,
      minCapacityL: filters.value.minCapacityL ?? undefined,
      capacityL: filters.value.capacityL ?? undefined,
      rackId: filters.value.rackId ?? undefined,
      page: page.value,
      pageSize: pageSize.value,
    })),
  };
}
