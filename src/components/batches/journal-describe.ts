import type { JournalPayload } from '@shared/schemas/journal';
import { TASTING_SCORE_MAX } from '@shared/schemas/journal';
import { isReadableDate } from '@shared/schemas/value-ranges';
import { EMPTYING_REASON_LABELS } from '@shared/schemas/vessel-emptying';
import { tastingWords } from '@shared/domain/tasting-scale';
import { liquidWords } from './top-up-words';

/** The formatting functions the descriptions need (useFormat provides them). */
export interface JournalFormat {
  volume: (litres: number) => string;
  temperature: (celsius: number) => string;
  gravity: (sg: number) => string;
  date: (iso: string) => string;
}

export interface EntryDescription {
  icon: string;
  title: string;
  lines: string[];
}

type Vessels = { vesselName: string; volumeL: number }[];
const vesselList = (vessels: Vessels, f: JournalFormat) => vessels.map((v) => `${v.vesselName} (${f.volume(v.volumeL)})`).join(', ');

/**
 * An icon, a title and a few plain lines for one journal entry.
 * @param payload - the entry's payload with its corrections applied (effectivePayload, shared/domain/journal.ts)
 */
export function describeEntry(payload: JournalPayload, f: JournalFormat): EntryDescription {
  switch (payload.kind) {
    case 'started':
      return {
        icon: 'play_circle',
        title: payload.parents.length > 1 ? 'Started as a blend' : payload.parents.length === 1 ? 'Split off as its own batch' : 'Started',
        lines: [
          `${f.volume(payload.volumeL)} into ${vesselList(payload.vessels, f)}`,
          payload.og !== null ? `Original gravity ${f.gravity(payload.og)}` : '',
          payload.parents.length ? `From ${payload.parents.map((p) => `${p.name} (${f.volume(p.volumeL)})`).join(', ')}` : '',
          payload.override ? `Vessel not sanitised, used anyway: ${payload.override}` : '',
        ],
      };
    case 'reading':
      return {
        icon: 'straighten',
        title: `Reading ${f.gravity(payload.correctedSg)}`,
        lines: [
          payload.temperatureC !== null ? `Read ${f.gravity(payload.sg)} at ${f.temperature(payload.temperatureC)}` : `Read ${f.gravity(payload.sg)}`,
          payload.ph !== null ? `pH ${payload.ph.toFixed(2)}` : '',
        ],
      };
    case 'racked':
      return {
        icon: 'move_down',
        title: 'Racked',
        lines: [
          `From ${vesselList(payload.from, f)}`,
          `Into ${vesselList(payload.to, f)}`,
          payload.lossL > 0 ? `About ${f.volume(payload.lossL)} left on the lees` : '',
          payload.override ? `Vessel not sanitised, used anyway: ${payload.override}` : '',
        ],
      };
    case 'addition':
      return {
        icon: 'add_circle',
        title: `Added ${payload.name}`,
        lines: [`${payload.amount} ${payload.unit}\u00a0· ${payload.category}`, removeOnWords(payload.removeOn, f)],
      };
    case 'removed':
      return { icon: 'remove_circle', title: `Took out ${payload.name}`, lines: [] };
    case 'topped-up':
      return {
        icon: 'vertical_align_top',
        title: 'Topped up',
        lines: [
          `${f.volume(payload.volumeL)} of ${payload.with} into ${payload.vesselName}`,
          payload.liquid ? `Liquid: ${liquidWords(payload.liquid, f.gravity)}` : '',
        ],
      };
    case 'degassed':
      return { icon: 'bubble_chart', title: 'Degassed', lines: [payload.note] };
    case 'tasted':
      return {
        icon: 'wine_bar',
        title: payload.score !== null ? `Tasted\u00a0· ${tastingWords(payload.score)} (of ${TASTING_SCORE_MAX})` : 'Tasted',
        lines: [
          payload.appearance ? `Appearance: ${payload.appearance}` : '',
          payload.aroma ? `Aroma: ${payload.aroma}` : '',
          payload.flavour ? `Flavour: ${payload.flavour}` : '',
        ],
      };
    case 'note':
      return { icon: 'edit_note', title: 'Note', lines: [payload.text] };
    case 'photo':
      return { icon: 'photo_camera', title: 'Photo', lines: [payload.caption] };
    case 'bottled':
      return {
        icon: 'liquor',
        title: `Bottled\u00a0· lot ${payload.lotCode}`,
        lines: [
          `${payload.bottleCount} × ${payload.bottleMl} mL in ${payload.caseCount} ${payload.caseCount === 1 ? 'case' : 'cases'}`,
          `From ${vesselList(payload.from, f)}`,
          payload.confirmedNotFinished ? 'Bottled although the fermentation did not look finished' : '',
        ],
      };
    case 'split':
      return { icon: 'call_split', title: `Split off ${payload.childName}`, lines: [vesselList(payload.vessels, f)] };
    case 'blended':
      return { icon: 'merge', title: `Blended into ${payload.childName}`, lines: [f.volume(payload.volumeL)] };
    case 'emptied':
      return {
        icon: 'format_color_reset',
        title: `Emptied ${payload.vesselName}`,
        lines: [`${f.volume(payload.volumeL)} poured out\u00a0· ${EMPTYING_REASON_LABELS[payload.reason]}`, payload.note],
      };
    case 'amendment':
      return { icon: 'edit', title: 'Correction', lines: [payload.reason] };
  }
}

/** "sg 1.050, pH 3.40" — what a correction changed, in short. */
export function describeChanges(changes: Record<string, unknown>, f: JournalFormat): string {
  return Object.entries(changes)
    .filter(([key]) => key !== 'correctedSg')
    .map(([key, value]) => {
      if (value === null || value === '') return `${key} cleared`;
      if (key === 'sg' && typeof value === 'number') return `gravity ${f.gravity(value)}`;
      if (key === 'temperatureC' && typeof value === 'number') return `temperature ${f.temperature(value)}`;
      if (key === 'removeOn' && typeof value === 'string') {
        return isReadableDate(value) ? `comes out ${f.date(value)}` : `take-out date unreadable (${value})`;
      }
      return `${key} ${String(value)}`;
    })
    .join(', ');
}

/** The take-out line of an addition; a stored date that cannot be read says so (amend it) instead of showing nonsense. */
function removeOnWords(removeOn: string | null, f: JournalFormat): string {
  if (!removeOn) return '';
  return isReadableDate(removeOn) ? `To come out on ${f.date(removeOn)}` : `Take-out date unreadable (${removeOn}): amend this entry to set it`;
}
