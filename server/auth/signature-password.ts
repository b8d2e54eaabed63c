import bcrypt from 'bcryptjs';

/** Compared against when nobody matches, so an unknown person takes as long as a wrong password. */
const hashForNobody = bcrypt.hashSync('luxtempo-no-such-signer', 10);

/**
 * The password check of a signature: a person confirms an act (signing an order, authorising UV
 * below the thickness minimum) by typing their own sign-in password. One function for every such act.
 */
export async function signaturePasswordMatches(person: { passwordHash: string } | null | undefined, password: string): Promise<boolean> {
  const matches = await bcrypt.compare(password, person?.passwordHash ?? hashForNobody);
  return matches && !!person;
}
