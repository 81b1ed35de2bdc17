/** Every operation the Batch page offers, by the dialog it opens. */
export type BatchOperation =
  | 'reading'
  | 'rack'
  | 'addition'
  | 'bottle'
  | 'top-up'
  | 'taste'
  | 'note'
  | 'photo'
  | 'degas'
  | 'split'
  | 'blend'
  | 'edit';

export interface OperationButton {
  op: BatchOperation;
  label: string;
  icon: string;
  /** Needs the batch to be in at least one vessel. */
  needsVessels: boolean;
}

/** Shown as big buttons on every screen. */
export const PRIMARY_OPERATIONS: OperationButton[] = [
  { op: 'reading', label: 'Log a reading', icon: 'straighten', needsVessels: false },
  { op: 'rack', label: 'Rack', icon: 'move_down', needsVessels: true },
  { op: 'addition', label: 'Add', icon: 'add_circle', needsVessels: true },
  { op: 'bottle', label: 'Bottle', icon: 'liquor', needsVessels: true },
];

/** In a menu on a phone, as plain buttons on a wide screen. */
export const SECONDARY_OPERATIONS: OperationButton[] = [
  { op: 'top-up', label: 'Top up', icon: 'vertical_align_top', needsVessels: true },
  { op: 'taste', label: 'Taste', icon: 'wine_bar', needsVessels: false },
  { op: 'note', label: 'Note', icon: 'edit_note', needsVessels: false },
  { op: 'photo', label: 'Photo', icon: 'photo_camera', needsVessels: false },
  { op: 'degas', label: 'Degas', icon: 'bubble_chart', needsVessels: true },
  { op: 'split', label: 'Split', icon: 'call_split', needsVessels: true },
  { op: 'blend', label: 'Blend', icon: 'merge', needsVessels: true },
  { op: 'edit', label: 'Edit', icon: 'edit', needsVessels: false },
];
