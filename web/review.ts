// The review logic lives in the core (src/report/review.ts) so exports compose the same everywhere.
export * from '../src/report/review';
