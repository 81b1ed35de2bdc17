import { PT_PER_MM, type LabelTemplate } from './template-schema';

/** Millimetres to PDF points. */
export const mm = (value: number): number => value * PT_PER_MM;

/** Labels on one sheet (1 for a roll). */
export function labelsPerPage(t: Pick<LabelTemplate, 'grid'>): number {
  return t.grid.columns * t.grid.rows;
}

/** Pages needed for `count` labels after skipping `skip` cells of the first sheet. */
export function pageCount(t: Pick<LabelTemplate, 'grid'>, count: number, skip = 0): number {
  return count === 0 ? 0 : Math.ceil((skip + count) / labelsPerPage(t));
}

/** Top-left corner (mm, from the page's top-left) of a cell, counted row by row from 0. */
export function cellOrigin(t: Pick<LabelTemplate, 'grid' | 'label'>, cell: number): { x: number; y: number } {
  const { grid, label } = t;
  const column = cell % grid.columns;
  const row = Math.floor(cell / grid.columns);
  return { x: grid.left + column * (label.width + grid.gapX), y: grid.top + row * (label.height + grid.gapY) };
}

export interface Placement {
  /** 0-based page. */
  page: number;
  /** 0-based cell on that page, row by row. */
  cell: number;
  /** Cell origin in mm. */
  x: number;
  y: number;
}

/**
 * Where each of `count` labels goes: the first `skip` cells of the first sheet stay empty
 * (a partly used sheet), then cells are filled left to right, top to bottom, page after page.
 */
export function placeLabels(t: Pick<LabelTemplate, 'grid' | 'label'>, count: number, skip = 0): Placement[] {
  const perPage = labelsPerPage(t);
  return Array.from({ length: count }, (_, i) => {
    const slot = skip + i;
    const cell = slot % perPage;
    return { page: Math.floor(slot / perPage), cell, ...cellOrigin(t, cell) };
  });
}
