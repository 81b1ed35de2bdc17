import { Router } from 'express';
import type { DataSource } from 'typeorm';

/** Label URLs (/s/:code) and code look-ups; filled in by the labels and scanning work. */
export function scanRoutes(_ds: DataSource): Router {
  return Router();
}
