import dayjs from 'dayjs';
import relativeTime from 'dayjs/plugin/relativeTime';
import { computed } from 'vue';
import { ageInDays, formatMass, formatTemperature, formatVolume, litresFrom, litresTo } from '@shared/calc';
import { usePreferencesStore } from '@/stores/preferences';
import { datesInStyle, formatDateInStyle } from './date-style';
import { quantitiesInUnits } from './message-units';
import { useUnits } from './useUnits';

dayjs.extend(relativeTime);

/**
 * Formatting in the user's units and the cellar's conventions. Values are kept in SI
 * everywhere; only what is shown changes.
 */
export function useFormat() {
  const { system } = useUnits();
  const volumeUnit = computed(() => (system.value === 'us' ? 'US gal' : 'L'));
  const preferences = usePreferencesStore();
  /** A calendar date (YYYY-MM-DD) or an instant (its local day) in the user's date style. */
  const date = (iso: string | Date | null | undefined) => {
    if (!iso) return '—';
    const day = typeof iso === 'string' && /^\d{4}-\d{2}-\d{2}$/.test(iso) ? iso : dayjs(iso).format('YYYY-MM-DD');
    return formatDateInStyle(day, preferences.dateStyle);
  };

  return {
    system,
    /** "19 L" or "5.02 US gal". */
    volume: (litres: number | null | undefined) => (litres == null ? '—' : formatVolume(litres, system.value)),
    temperature: (celsius: number | null | undefined) => (celsius == null ? '—' : formatTemperature(celsius, system.value)),
    mass: (kg: number | null | undefined) => (kg == null ? '—' : formatMass(kg, system.value)),
    /** The unit volume inputs are typed in. */
    volumeUnit,
    /**
     * A typed volume (in the user's unit) to litres. Never throws: a negative or odd number
     * typed into a form converts as it is, so the form's schema shows its message under the
     * field instead of the conversion failing while the form is drawn (which blanked it).
     */
    toLitres: (value: number) =>
      Number.isFinite(value) ? Math.sign(value) * litresFrom(Math.abs(value), volumeUnit.value === 'L' ? 'L' : 'US gal') : value,
    /** Litres to the user's unit, for filling an input. */
    fromLitres: (litres: number) => Number(litresTo(litres, volumeUnit.value === 'L' ? 'L' : 'US gal').toFixed(2)),
    gravity: (sg: number | null | undefined) => (sg == null ? '—' : sg.toFixed(3)),
    date,
    dateTime: (iso: string | Date | null | undefined) => (iso ? `${date(iso)}, ${dayjs(iso).format('HH:mm')}` : '—'),
    /** A message (a server's, say) with its YYYY-MM-DD dates in the user's style. */
    datesInMessage: (message: string) => datesInStyle(message, preferences.dateStyle),
    /** A shared schema's message with its metric limits in the user's units ("at most 104 °F"). */
    limitsInUnits: (message: string) => quantitiesInUnits(message, system.value),
    fromNow: (iso: string | Date | null | undefined) => (iso ? dayjs(iso).fromNow() : '—'),
    /** Whole days since a date, by the cellar's one age rule (shared/calc ageInDays). */
    daysSince: (iso: string | Date) => ageInDays(dayjs(iso).format('YYYY-MM-DD'), dayjs().format('YYYY-MM-DD')),
  };
}
