// Size limits of a Floe Ledger log file. They are part of the published format (docs/format.md)
// and are checked before the file is parsed where that is possible (file size, nesting depth,
// string length, array length), so a hostile or broken file cannot exhaust memory or the stack.
// The figures leave about ten times the room a long cruise needs: a 3-month cruise with hourly
// observations has about 2,200 observations and, at one fix a second, 8 million track points
// are thinned by the track recorder to well under a million.

export const LIMITS = {
  /** Largest file accepted, in bytes (JSON or zip archive). */
  maxFileBytes: 512 * 1024 * 1024,
  /** Deepest nesting of arrays and objects. The format itself needs 7. */
  maxDepth: 12,
  /** Longest string, in UTF-16 code units (notes are the long ones). */
  maxStringLength: 100_000,
  /** Most elements in any one array (the track's point list is the long one). */
  maxArrayLength: 5_000_000,
  /** Observations in one file. */
  maxObservations: 500_000,
  /** Earlier revisions or conflicting copies kept with one observation. */
  maxVersionsPerObservation: 1_000,
  /** Track points in one file. */
  maxTrackPoints: 5_000_000,
  /** Photos referenced in one file. */
  maxPhotos: 100_000,
  /** Photos attached to one observation. */
  maxPhotosPerObservation: 50,
  /** Observers of one cruise. */
  maxObservers: 200,
  /** Reviewed findings kept on one observation. */
  maxReviews: 200,
  /** Largest log entry inside an archive once unpacked, in bytes: as large as a JSON log may be. */
  maxArchiveLogBytes: 512 * 1024 * 1024,
  /** Largest single photo inside an archive, in bytes. */
  maxPhotoBytes: 50 * 1024 * 1024,
  /** Earliest and latest year of any time in a log: year 0000 or 9999 is a typing or clock error. */
  earliestYear: 1900,
  latestYear: 2199,
  /** Most entries in a zip archive. */
  maxArchiveEntries: 100_002,
  /** Total uncompressed size of a zip archive, in bytes (guards against zip bombs). */
  maxArchiveUncompressedBytes: 2 * 1024 * 1024 * 1024,
} as const;

/** How many problems a rejected file lists one by one; the rest are counted. */
export const MAX_LISTED_PROBLEMS = 20;

/**
 * How many schema errors a validator keeps; the rest are only counted. Without a cap a file of
 * a million bad track rows holds millions of error objects. Baked into the generated validators
 * (scripts/build-validators.ts): regenerate them after changing it.
 */
export const MAX_SCHEMA_ERRORS = 100;
