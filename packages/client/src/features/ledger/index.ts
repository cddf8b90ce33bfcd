export { ledgerKeys } from './api/keys';
