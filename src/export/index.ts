export { TABLE_DECIMALS, formatNumber } from './format-number.js';
export { writeCsv } from './write-csv.js';
