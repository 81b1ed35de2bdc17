/**
 * When a batch is due for racking — common practice, not a published rule: off the gross
 * lees after about a month in primary, then every three months or so while it clears.
 */
export const RACK_PRIMARY_AFTER_DAYS = 30;
export const RACK_AGAIN_AFTER_DAYS = 90;
