import { computed, reactive, watch } from 'vue';
import { useRoute, useRouter, type LocationQuery } from 'vue-router';

/** What the Labels page will print; mirrors the PDF endpoint's selection. */
export interface LabelSelectionState {
  vessels: string[];
  cases: string[];
  lots: string[];
  /** Every case of one lot (`?lot=` in the page URL). */
  lotCases: string | null;
  shelf: string | null;
  batch: string | null;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
const list = (value: unknown) => (typeof value === 'string' ? value.split(',') : []).map((s) => s.trim()).filter((s) => UUID.test(s));
const one = (value: unknown) => (typeof value === 'string' && UUID.test(value) ? value : null);

function fromQuery(q: LocationQuery): LabelSelectionState {
  return {
    vessels: list(q.vessels),
    cases: list(q.cases),
    lots: list(q.lots),
    lotCases: one(q.lot),
    shelf: one(q.shelf),
    batch: one(q.batch),
  };
}

function toQuery(s: LabelSelectionState): Record<string, string> {
  const q: Record<string, string> = {};
  if (s.vessels.length) q.vessels = s.vessels.join(',');
  if (s.cases.length) q.cases = s.cases.join(',');
  if (s.lots.length) q.lots = s.lots.join(',');
  if (s.lotCases) q.lot = s.lotCases;
  if (s.shelf) q.shelf = s.shelf;
  if (s.batch) q.batch = s.batch;
  return q;
}

/**
 * The Labels page's selection, prefilled from the page URL (`vessels`, `cases`, `lots`,
 * `lot`, `shelf`, `batch` — other pages link here with those) and written back to it, so a
 * selection can be bookmarked or shared with another member.
 */
export function useLabelSelection() {
  const route = useRoute();
  const router = useRouter();
  const selection = reactive<LabelSelectionState>(fromQuery(route.query));

  watch(
    () => toQuery(selection),
    (query) => {
      void router.replace({ query: { ...query } });
    },
    { deep: true },
  );

  const isEmpty = computed(
    () =>
      !selection.vessels.length && !selection.cases.length && !selection.lots.length && !selection.lotCases && !selection.shelf && !selection.batch,
  );

  function clear(): void {
    Object.assign(selection, { vessels: [], cases: [], lots: [], lotCases: null, shelf: null, batch: null });
  }

  /** Adds or removes ids of one kind. */
  function toggle(kind: 'vessels' | 'cases' | 'lots', ids: string[], on: boolean): void {
    const set = new Set(selection[kind]);
    for (const id of ids) {
      if (on) set.add(id);
      else set.delete(id);
    }
    selection[kind] = [...set];
  }

  return { selection, isEmpty, clear, toggle };
}
