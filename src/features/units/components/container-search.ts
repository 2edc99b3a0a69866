/** The box a container number is searched with, on a phone: capitals, no autocorrect or suggestions, a search key. */
export const containerSearchInput = {
  name: 'q',
  autoComplete: 'off',
  autoCapitalize: 'characters',
  autoCorrect: 'off',
  spellCheck: false,
  enterKeyHint: 'search',
  maxLength: 20,
} as const;
