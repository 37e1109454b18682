// The deterministic exp/log live in the core (src/numeric/det-math.ts); the worker also installs them globally.
export { detExp, detLog, installDeterministicMath } from '../src/numeric/det-math';
