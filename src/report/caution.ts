// The short caution every output carries (README, terminal summaries, summary.json, viewer).
export const CAUTION =
  'Research and teaching tool, not a medical device: results depend on sensor type, calibration, placement and the ' +
  'settings shown; check them against arterial blood gases; local protocols and licensed clinicians decide.';
