// The auth feature's public surface for other features (their api/ folders aside).
export { newAccountForm, newPasswordForm } from './forms';
