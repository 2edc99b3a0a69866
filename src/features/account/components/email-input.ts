/** The sign-in e-mail box: an e-mail keyboard, no capitals or spelling help, filled in by password managers. */
export const emailInput = {
  label: 'E-mail',
  type: 'email',
  inputMode: 'email',
  autoComplete: 'username',
  autoCapitalize: 'none',
  spellCheck: false,
} as const;
