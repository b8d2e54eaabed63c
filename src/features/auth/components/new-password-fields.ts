/** The rule shown under every new-password field; the server checks the same, and the common-password list. */
export const newPasswordHint =
  'At least 12 characters. A few unrelated words make a good one; common passwords are refused.';
