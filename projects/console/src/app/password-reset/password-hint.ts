/** The password policy in one line (the server checks it: at least 12 characters, not common). */
export const PASSWORD_HINT =
  'At least 12 characters; a few unrelated words work well. Very common passwords are refused.';
