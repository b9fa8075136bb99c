// Ice charts and concentration grids against the observations: the pure part (models, SIGRID-3
// codes, point in polygon, grid sampling, collocation, agreement statistics).
export * from './chartModel.ts';
export * from './sigrid3.ts';
export * from './polygon.ts';
export * from './gridSample.ts';
export * from './collocate.ts';
export * from './agreement.ts';
export * from './report.ts';
export * from './disagreement.ts';
export * from './agreementPlots.ts';
