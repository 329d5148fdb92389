// Quotas per user and per group: runs in flight and cell-updates per day (quota-check.ts explains who gets what).
export { enforceQuotas, QuotaExceeded, type QuotaConfig, type QuotaDemand } from './quota-check'
export { BUDGET_WINDOW_S } from './daily-budget'
