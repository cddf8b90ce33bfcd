/** What this feature offers other features; everything else in the folder is private to it. */
export { healthKeys } from './api/keys';
export { useWithdrawals } from './api/get-withdrawals';
export { WithdrawalLine } from './components/withdrawals-card';
export { MedicineCaution } from './components/medicine-caution';
export { TreatmentForm } from './components/treatment-form';
