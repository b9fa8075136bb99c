// Cruise statistics for the review screen and the CLI summary.
export { reviewCruise, POLARIS_OUTCOMES, defaultRidgeEstimate, trackToColumns, compareObservations, type TrackColumns } from './review.ts';
export { ReviewLedger, changedStretch, type ReviewLedgerOptions } from './ledger.ts';
export type { CruiseReview, CruiseSummary, ReviewInput, TimeAndDistance, ObserverSummary, RegimeSummary, OutcomeSummary } from './review.ts';
export { ATTRIBUTION_CAP_FACTOR, attributeTime, type Attribution, type ObservationGap } from './attribution.ts';
export { ICE_REGIMES, ICE_REGIME_LABELS, IN_ICE_MIN_TENTHS, iceRegime, isInIce, type IceRegime } from './regimes.ts';
export { latitudeBandLabel, type LatitudeBand, type LatitudeBandTable } from './bands.ts';
export type { HandoverTable, HandoverPair, ObserverOffset, DifferenceStats } from './handover.ts';
export { packSeries, unpackSeries, type ReviewSeries, type PackedSeries } from './series.ts';
export type { IceFigures, StageShare } from './icePool.ts';
export { categoryWeight, observationFigures, type ObservationFigures, type RidgeThicknessEstimate } from './observationFigures.ts';
export { legDistanceM, SHORT_LEG_LIMIT_M } from './legDistance.ts';
export { buildDistanceTimeline, distanceAt, distanceBetween, type DistanceTimeline, type DistanceSource } from './distanceTimeline.ts';
export { rioForObservation, type RioOnly } from './rio.ts';
export { collectFindings, reviewFor, withFindingReview, withoutFindingReview, type ReviewFinding } from './findings.ts';
export { equivalentThicknessCm } from './ridgeEstimate.ts';
export { MAP_CAUTION, REVIEW_CAUTIONS, RIDGE_ESTIMATE_CAUTION, RIDGE_FIGURE_ESTIMATES, VISUAL_ESTIMATE_CAUTION, type RidgeFigure } from './cautions.ts';
