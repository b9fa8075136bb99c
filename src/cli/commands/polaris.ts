// `polaris`: the POLARIS risk index outcome (IMO MSC.1/Circ.1519) for an ice regime typed on
// the command line. Shares are whole tenths; what they leave of 10 is ice free.

import { VESSEL_ICE_CLASSES, type VesselIceClass } from '../../domain/model.ts';
import {
  POLARIS_ICE_TYPES, POLARIS_ICE_TYPE_LABELS, VESSEL_ICE_CLASS_LABELS, computeRio, isPolarisIceType, parseVesselIceClass,
  type PolarisResult, type RegimeShare,
} from '../../domain/polaris.ts';
import { parseOptions, stringOption } from '../args.ts';
import { EXIT_OK, UsageError, type CliIO, type Command } from '../command.ts';

const usage = `Usage: npm run cli -- polaris --class <class> --ice "<tenths>:<ice type>,..." [--json] [--decay-confirmed]

Prints the POLARIS risk index outcome (RIO) of IMO MSC.1/Circ.1519 for an ice regime.
Shares are whole tenths; whatever they leave of 10 is ice free.

  --class            ${VESSEL_ICE_CLASSES.map((c) => VESSEL_ICE_CLASS_LABELS[c]).join(', ')}
                     (any case; spaces and hyphens optional: "PC 5", "pc5", "IA Super")
  --ice              comma-separated <tenths>:<ice type>, ice types:
                     ${POLARIS_ICE_TYPES.join(', ')}
  --json             print one JSON object (rio, outcome, regime, speedLimitKn, cautions)
  --decay-confirmed  use the decayed-ice values; only when decay is confirmed by ice
                     information or qualified personnel (Polar Code chapter 12)

Example: npm run cli -- polaris --class PC5 --ice "6:thick-first-year,3:second-year"

POLARIS output is decision support. It does not replace the Polar Code, the ship's Polar Water
Operational Manual, the master's judgement or local regulations.`;

/** The class as typed: our keys or the circular's spellings, any case or spacing (`PC 5`, `IA Super`). */
export function parseIceClass(text: string): VesselIceClass {
  const r = parseVesselIceClass(text);
  if (!r.ok) throw new UsageError(r.error);
  return r.value;
}

/** `6:thick-first-year,3:second-year` into shares; every error names the bad part. */
export function parseIceRegime(text: string): RegimeShare[] {
  if (text.trim() === '') throw new UsageError('--ice is empty: give shares such as "6:thick-first-year,3:second-year"');
  const shares: RegimeShare[] = [];
  for (const raw of text.split(',')) {
    const part = raw.trim();
    const m = /^([^:]*):(.*)$/.exec(part);
    if (!m) throw new UsageError(`ice share "${part}" must be <tenths>:<ice type>, e.g. "6:thick-first-year"`);
    const num = (m[1] ?? '').trim();
    const type = (m[2] ?? '').trim().toLowerCase();
    if (!/^[+-]?\d+(\.\d+)?$/.test(num)) throw new UsageError(`share "${num}" in "${part}" is not a number of tenths`);
    const tenths = Number(num);
    if (tenths < 0) throw new UsageError(`share ${num} in "${part}" is negative`);
    if (!Number.isInteger(tenths)) throw new UsageError(`share ${num} in "${part}" is not a whole number of tenths`);
    if (tenths > 10) throw new UsageError(`share ${num} in "${part}" is more than 10 tenths`);
    if (!isPolarisIceType(type)) {
      throw new UsageError(`unknown ice type "${m[2]?.trim()}" in "${part}" (use one of ${POLARIS_ICE_TYPES.join(', ')})`);
    }
    if (shares.some((s) => s.iceType === type)) throw new UsageError(`ice type "${type}" is given twice in "${text}"`);
    shares.push({ iceType: type, tenths });
  }
  const sum = shares.reduce((a, s) => a + s.tenths, 0);
  if (sum > 10) throw new UsageError(`the shares in "${text}" add up to ${sum} tenths, more than 10`);
  return shares;
}

function printText(r: PolarisResult, io: CliIO): void {
  io.stdout(`POLARIS risk index outcome (IMO MSC.1/Circ.1519), ice class ${VESSEL_ICE_CLASS_LABELS[r.iceClass]}${r.decayConfirmed ? ', decayed ice' : ''}`);
  const width = Math.max(...r.regime.map((t) => POLARIS_ICE_TYPE_LABELS[t.iceType].length));
  for (const t of r.regime) {
    const riv = (t.riv >= 0 ? ' ' : '') + String(t.riv);
    io.stdout(`  ${String(t.tenths).padStart(2)}/10  ${POLARIS_ICE_TYPE_LABELS[t.iceType].padEnd(width)}  RIV ${riv.padStart(3)}  C x RIV ${String(t.tenths * t.riv).padStart(4)}`);
  }
  io.stdout(`RIO ${r.rio}: ${r.outcomeLabel.toLowerCase()}`);
  if (r.speedLimitKn !== null) io.stdout(`Speed limit at elevated operational risk (Table 1.2): ${r.speedLimitKn} kn`);
  for (const c of r.cautions) io.stdout(`Caution: ${c}`);
}

export const polarisCommand: Command = {
  name: 'polaris',
  summary: 'POLARIS risk index outcome for an ice class and ice regime',
  usage,
  run(args, io) {
    const { values } = parseOptions(args, {
      class: { type: 'string' },
      ice: { type: 'string' },
      json: { type: 'boolean' },
      'decay-confirmed': { type: 'boolean' },
    });
    const iceClass = parseIceClass(stringOption(values, 'class', true));
    const shares = parseIceRegime(stringOption(values, 'ice', true));
    const decayConfirmed = values['decay-confirmed'] === true;
    const result = computeRio(iceClass, shares, { decayConfirmed });
    if (!result.ok) throw new UsageError(result.error);
    const r = result.value;
    if (values.json === true) {
      const { iceClass: cls, rio, outcome, outcomeLabel, speedLimitKn, regime, cautions } = r;
      io.stdout(JSON.stringify({ iceClass: cls, rio, outcome, outcomeLabel, speedLimitKn, decayConfirmed, regime, cautions }));
    } else {
      printText(r, io);
    }
    return EXIT_OK;
  },
};
