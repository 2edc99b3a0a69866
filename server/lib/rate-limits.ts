// How many sign-in and password-reset tries the app allows (decision record 007); createApp takes overrides.

export type RateLimits = {
  /** Failed sign-ins from one address (IPv6: one /64), over all accounts, per hour. */
  signInPerIp: number;
  /**
   * Failed sign-ins on one account per hour from devices it has never signed in on. Past it the account accepts only
   * its known devices (and password-reset links) until the hour is over.
   */
  signInPerAccount: number;
  /** Tries of one account from one address (or one known device) before each further try has to wait. */
  signInFreeTries: number;
  /** The first wait; it doubles with each further try, up to signInMaxDelaySeconds. */
  signInDelaySeconds: number;
  signInMaxDelaySeconds: number;
  /** Password-reset requests per address and per e-mail address per 15 minutes. */
  resetPerIp: number;
  resetPerEmail: number;
};

export const DEFAULT_RATE_LIMITS: RateLimits = {
  signInPerIp: 50,
  signInPerAccount: 30,
  signInFreeTries: 5,
  signInDelaySeconds: 1,
  signInMaxDelaySeconds: 15 * 60,
  resetPerIp: 20,
  resetPerEmail: 3,
};
