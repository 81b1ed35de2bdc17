import dayjs from 'dayjs';
import relativeTime from 'dayjs/plugin/relativeTime';
import { computed } from 'vue';
import { formatMass, formatTemperature, formatVolume, litresFrom, litresTo } from '@shared/calc';
import { useUnits } from './useUnits';

dayjs.extend(relativeTime);

/**
 * Formatting in the user's units and the cellar's conventions. Values are kept in SI
 * everywhere; only what is shown changes.
 */
export function useFormat() {
  const { system } = useUnits();
  const volumeUnit = computed(() => (system.value === 'us' ? 'US gal' : 'L'));

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
    date: (iso: string | Date | null | undefined) => (iso ? dayjs(iso).format('D MMM YYYY') : '—'),
    dateTime: (iso: string | Date | null | undefined) => (iso ? dayjs(iso).format('D MMM YYYY, HH:mm') : '—'),
    fromNow: (iso: string | Date | null | undefined) => (iso ? dayjs(iso).fromNow() : '—'),
    /** Whole days since a date. */
    daysSince: (iso: string | Date) => dayjs().startOf('day').diff(dayjs(iso).startOf('day'), 'day'),
  };
}
