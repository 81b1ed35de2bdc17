import type { JournalPayload } from '../../shared/schemas/journal';

const names = (list: { vesselName?: string }[] | undefined) => (list ?? []).map((v) => v.vesselName ?? 'a vessel').join(', ');
/** Gravity as the trade writes it: three decimals (1.050). */
const sg = (value: number) => value.toFixed(3);
const clip = (text: string, length = 120) => (text.length > length ? `${text.slice(0, length - 1)}…` : text);

/** One line saying what a journal entry recorded, for the audit list (litres and SG, as stored). */
export function entrySummary(payload: JournalPayload): string {
  switch (payload.kind) {
    case 'started':
      return `Started with ${payload.volumeL} L${payload.og ? `, OG ${sg(payload.og)}` : ''}`;
    case 'reading':
      return `Reading SG ${sg(payload.sg)}${payload.temperatureC !== null ? ` at ${payload.temperatureC} °C` : ''}`;
    case 'racked':
      return `Racked from ${names(payload.from)} to ${names(payload.to)}, ${payload.lossL} L lost`;
    case 'addition':
      return `Added ${payload.amount} ${payload.unit} ${payload.name}`;
    case 'removed':
      return `Took out ${payload.name}`;
    case 'topped-up':
      return `Topped up ${payload.vesselName} with ${payload.volumeL} L ${payload.with}`;
    case 'degassed':
      return 'Degassed';
    case 'tasted':
      return `Tasted${payload.score !== null ? `, score ${payload.score}` : ''}`;
    case 'note':
      return clip(payload.text);
    case 'photo':
      return `Photo${payload.caption ? `: ${clip(payload.caption)}` : ''}`;
    case 'bottled':
      return `Bottled ${payload.bottleCount} × ${payload.bottleMl} mL (lot ${payload.lotCode})`;
    case 'split':
      return `Split off ${payload.childName}`;
    case 'blended':
      return `Blended into ${payload.childName}`;
    case 'emptied':
      return `Emptied ${payload.vesselName}, ${payload.volumeL} L poured out (${payload.reason}${payload.note ? `: ${clip(payload.note)}` : ''})`;
    case 'amendment':
      return `Corrected ${Object.keys(payload.changes).join(', ')}: ${clip(payload.reason)}`;
  }
}
