import bcrypt from 'bcryptjs';

/** bcrypt cost factor; 12 is the floor the accounts issue sets (about 0.25 s a hash here). */
export const BCRYPT_COST = 12;

export const hashPassword = (password: string) => bcrypt.hash(password, BCRYPT_COST);

// Compared against when the e-mail is unknown, so both failures take the same time.
const DUMMY_HASH = bcrypt.hashSync('fanlight-no-such-user', BCRYPT_COST);

export async function verifyPassword(password: string, hash: string | null): Promise<boolean> {
  const ok = await bcrypt.compare(password, hash ?? DUMMY_HASH);
  return ok && hash !== null;
}
