/**
 * Presentation: how Loopfold writes what it shows — variable names, numbers
 * with units, CSV. Pure TypeScript with no DOM, importing only the core's
 * model types, so the core's explanations, the figures, the reports, the
 * command line and the app share it. Colours are tokens of src/theme/.
 */
export { labelOf, labeller, unitOf } from './labels';
export { fixedText, formatNumber, MINUS, numText, precisionText, rounded, significant, quantityText, tableText, timeUnitWord, weightText, type NumberStyle } from './numbers';
export { csvField, defuseFormula, recordsToCsv, simulationCsv, toCsv, type CsvValue } from './csv';
export { studyCsv, type LongStudy } from './studyCsv';
