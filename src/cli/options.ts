// Options shared by `analyse` and `batch`: every one maps to a setting in src/settings.ts (the mapping and the
// settings file are read by src/node/resolve-settings.ts, which batch uses too).
import { type Command, InvalidArgumentError, Option } from 'commander';

function number(name: string) {
  return (v: string) => {
    const x = Number(v);
    if (!Number.isFinite(x)) throw new InvalidArgumentError(`${name} needs a number, got "${v}"`);
    return x;
  };
}

export function addInputOptions(cmd: Command): Command {
  return cmd
    .option('--settings <file>', 'settings file (JSON) holding any of the settings; options given here win')
    .option('--delimiter <char>', 'field delimiter: , ; or tab (default: detect)')
    .addOption(new Option('--decimal <mark>', 'decimal mark (default: detect)').choices(['.', ',']))
    .option('--time-col <name>', 'time column name (default: detect)')
    .option('--flow-col <name>', 'flow column name (default: detect)')
    .option('--co2-col <name>', 'CO2 column name (default: detect)')
    .addOption(new Option('--time-unit <unit>', 'time column unit').choices(['s', 'ms', 'clock']))
    .option('--rate <hz>', 'sampling rate when the file has no time column', number('--rate'))
    .addOption(new Option('--flow-unit <unit>', 'flow unit (default: from header or values)').choices(['L/s', 'L/min', 'mL/s']))
    .addOption(new Option('--co2-unit <unit>', 'CO2 unit (default: from header or values)').choices(['mmHg', 'kPa', '%']))
    .option('--pb <mmhg>', 'barometric pressure for % CO2, mmHg (default 760)', number('--pb'))
    .addOption(new Option('--co2-percent <basis>', '% CO2 basis: ambient (F x PB) or dry (F x (PB - 47))').choices(['ambient', 'dry']))
    .addOption(new Option('--flow-condition <c>', 'gas condition of the flow sensor: btps (default, no conversion), atps or atpd').choices(['btps', 'atps', 'atpd']))
    .option('--flow-temp <celsius>', 'gas temperature at the flow sensor for atps/atpd (default 22)', number('--flow-temp'))
    .addOption(new Option('--expiration <sign>', 'sign of expiratory flow in the file (default: infer)').choices(['positive', 'negative']))
    .option('--delay <s>', 'CO2-to-flow transport delay in seconds (default: estimate)', number('--delay'))
    .option('--response-ms <ms>', 'CO2 sensor time constant in ms (default: estimate)', number('--response-ms'))
    .option('--paco2 <mmhg>', 'arterial PCO2 for Enghoff dead space, mmHg', number('--paco2'))
    .option('--apparatus-ml <ml>', 'apparatus volume (mL) between sensor and patient, removed from every dead space (airway, Bohr, Enghoff, VD/VT)', number('--apparatus-ml'))
    .addOption(new Option('--petco2 <method>', 'end-tidal definition').choices(['line_end', 'last', 'max', 'mean_last']));
}
