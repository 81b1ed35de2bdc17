import { describe, expect, it } from 'vitest';
import { loadConfig } from '../../server/config';
import { neededRole } from '../../server/http/access';

describe('loadConfig', () => {
  it('uses loopback defaults', () => {
    const config = loadConfig({});
    expect(config).toMatchObject({ host: '127.0.0.1', port: 8460, pgPort: 54329, cookieSecure: false, databaseUrl: undefined });
    expect(config.publicUrl).toBe('http://127.0.0.1:8460');
    expect(Object.isFrozen(config)).toBe(true);
  });

  it('names every bad variable', () => {
    expect(() => loadConfig({ PORT: 'eighty', DATABASE_URL: 'nope' })).toThrow(/PORT[\s\S]*DATABASE_URL|DATABASE_URL[\s\S]*PORT/);
  });

  it('refreshes task snapshots every five minutes unless turned off, and names a bad schedule', () => {
    expect(loadConfig({}).taskSnapshotSchedule).toBe('*/5 * * * *');
    expect(loadConfig({ TASK_SNAPSHOT_CRON: 'off' }).taskSnapshotSchedule).toBeNull();
    expect(() => loadConfig({ TASK_SNAPSHOT_CRON: 'every day' })).toThrow(/TASK_SNAPSHOT_CRON: must be a cron expression/);
  });

  it('requires a session secret in production and then sends cookies only over HTTPS', () => {
    expect(() => loadConfig({ NODE_ENV: 'production' })).toThrow(/SESSION_SECRET/);
    const config = loadConfig({ NODE_ENV: 'production', SESSION_SECRET: 'x'.repeat(40) });
    expect(config.cookieSecure).toBe(true);
  });
});

describe('neededRole', () => {
  it('lets anyone read, Hands write and only Keepers delete', () => {
    expect(neededRole('GET', { write: 'hand' })).toBe('guest');
    expect(neededRole('POST', { write: 'hand' })).toBe('hand');
    expect(neededRole('PATCH', { write: 'keeper' })).toBe('keeper');
    expect(neededRole('DELETE', { write: 'hand' })).toBe('keeper');
  });
});
