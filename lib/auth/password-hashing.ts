// bcrypt settings shared by user creation and the sign-in check. One cost for every
// hash (the demo seed, db/seed-data.ts, uses the same), so that checking a password
// takes the same time for every account and for an unknown e-mail. 10 is the floor
// of the OWASP password-storage cheat sheet for bcrypt.
export const BCRYPT_ROUNDS = 10;

/** A hash of a random string nobody knows, compared against when the e-mail is unknown. */
export const DUMMY_HASH = '$2b$10$jW3VTN2ZF5NTa6UAYAbYhOtBee2JGOjfCdHhj2qyQCCH9L7liacDG';
