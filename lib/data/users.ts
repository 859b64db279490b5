import "server-only";
import { db } from "../db/connection";
import { verifyPassword } from "../auth/password";
import { Sequelize } from "sequelize";

/** The user with this e-mail and password, or null; the same time is spent either way. */
export async function findUserForSignIn(email: string, password: string) {
  const { User } = db().models;
  const user = await User.findOne({
    where: Sequelize.where(Sequelize.fn("lower", Sequelize.col("email")), email.toLowerCase()),
  });
  const ok = await verifyPassword(password, user?.passwordHash);
  return ok && user ? { id: user.id, email: user.email, name: user.name } : null;
}
