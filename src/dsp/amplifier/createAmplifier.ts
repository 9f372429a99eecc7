import type { AmplifierConfig } from '../../config/transmitterSchema';
import type { AmplifierModel } from './amplifierModel';
import { createTableModel } from './amAmTable';
import type { DriveSpec } from './drive';
import { createPolynomialModel } from './polynomial';
import { createRappModel } from './rapp';
import { createSalehModel } from './saleh';
import { createSoftLimiterModel } from './softLimiter';

/** Builds the amplifier model a configuration's `amplifier` object describes (defaults already applied by the schema). */
export function createAmplifierFromConfig(config: AmplifierConfig): AmplifierModel {
  switch (config.model) {
    case 'rapp':
      return createRappModel({
        smoothness: config.smoothness,
        gainDb: config.gainDb,
        outputSaturationAmplitude: config.outputSaturationAmplitude,
        ...(config.amPm ? { amPm: config.amPm } : {}),
      });
    case 'saleh':
      return createSalehModel({ alphaA: config.alphaA, betaA: config.betaA, alphaPhi: config.alphaPhi, betaPhi: config.betaPhi });
    case 'limiter':
      return createSoftLimiterModel({ gainDb: config.gainDb, outputSaturationAmplitude: config.outputSaturationAmplitude });
    case 'polynomial':
      return createPolynomialModel({
        coefficients: config.coefficients,
        maxInputAmplitude: config.maxInputAmplitude,
        ...(config.inputSaturationAmplitude !== undefined ? { inputSaturationAmplitude: config.inputSaturationAmplitude } : {}),
      });
    case 'table':
      return createTableModel({ inputUnit: config.inputUnit, rows: config.rows }, 'amplifier.rows');
  }
}

/** The drive an `amplifier` object asks for. */
export function driveOfConfig(config: AmplifierConfig): DriveSpec {
  return { reference: config.backoffReference, backoffDb: config.backoffDb };
}
