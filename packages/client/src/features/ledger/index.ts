export { ledgerKeys } from './api/keys';
export { centsFromText } from './components/money-input';
