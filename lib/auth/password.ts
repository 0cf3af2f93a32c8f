import bcrypt from "bcryptjs";

// bcrypt cost 12 (≈ 250 ms here): slow enough for stored hashes, fast enough for sign-in.
const COST = 12;

export const hashPassword = (plain: string) => bcrypt.hash(plain, COST);
export const verifyPassword = (plain: string, hash: string) => bcrypt.compare(plain, hash);

let dummy: Promise<string> | undefined;
/** A hash to compare against when the account does not exist, so timing does not tell. */
export const dummyHash = () => (dummy ??= bcrypt.hash("not-a-real-password", COST));

export { PASSWORD_MAX, PASSWORD_MIN } from "./password-policy";
