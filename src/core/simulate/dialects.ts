/**
 * Named log dialects the simulator can write (all read back by the importer). The names and
 * layouts are our own: a spread of what lab loggers commonly produce (common practice, no source).
 */
import type { LogDialect } from '../logformat';

export const SIM_DIALECTS: Readonly<Record<string, { description: string; dialect: Partial<LogDialect> }>> = {
  'si-csv': { description: 'comma, time in s, SI units (Pa, m3/s)', dialect: { digits: 'shortest' } },
  'bench-csv': {
    description: 'comma, time in s, mbar and µL/min in brackets',
    dialect: { units: { pressure: 'mbar', pressure_setpoint: 'mbar', flow: 'µL/min', flow_setpoint: 'µL/min' }, digits: 7 },
  },
  'eu-semicolon': {
    description: 'semicolon, decimal comma, elapsed hh:mm:ss,sss, kPa and µL/h in parentheses, BOM, CRLF',
    dialect: {
      delimiter: ';', decimal: ',', lineEnding: '\r\n', bom: true, timeFormat: 'elapsed', timeDecimals: 3, timeDecimalSign: ',',
      unitStyle: 'parens', units: { pressure: 'kPa', pressure_setpoint: 'kPa', flow: 'µL/h', flow_setpoint: 'µL/h' }, digits: 7,
    },
  },
  'iso-tab': {
    description: 'tab, ISO 8601 UTC timestamps, mbar and nL/min after an underscore',
    dialect: { delimiter: '\t', timeFormat: 'iso', timeDecimals: 3, isoZone: 'Z', unitStyle: 'underscore', units: { pressure: 'mbar', pressure_setpoint: 'mbar', flow: 'nL/min', flow_setpoint: 'nL/min' }, digits: 7 },
  },
  'clock-spaces': {
    description: 'runs of spaces, clock time of day, psi and µL/min on a second header row',
    dialect: { delimiter: 'whitespace', timeFormat: 'clock', timeDecimals: 3, unitStyle: 'units-row', units: { pressure: 'psi', pressure_setpoint: 'psi', flow: 'µL/min', flow_setpoint: 'µL/min' }, digits: 7 },
  },
  'ms-csv': {
    description: 'comma, time in ms, quoted numbers, Pa and mL/h, trailing delimiter',
    dialect: { timeFormat: 'milliseconds', timeDecimals: 3, quoteNumbers: true, trailingDelimiter: true, units: { pressure: 'Pa', pressure_setpoint: 'Pa', flow: 'mL/h', flow_setpoint: 'mL/h' }, digits: 8 },
  },
};

export const SIM_DIALECT_NAMES = Object.keys(SIM_DIALECTS);
