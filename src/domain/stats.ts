// Cruise statistics: see src/domain/stats/ (split into small modules) and docs/dev/review.md.
export * from './stats/index.ts';
