import { Router } from 'express';
import type { DataSource } from 'typeorm';

/**
 * Photos: `upload` is mounted at /api/cellars/:cellarId/batches/:batchId/photos,
 * `serve` at /api/cellars/:cellarId/photos. Filled in by the cellar records work.
 */
export function photoRoutes(_ds: DataSource): { upload: Router; serve: Router } {
  return { upload: Router({ mergeParams: true }), serve: Router({ mergeParams: true }) };
}
