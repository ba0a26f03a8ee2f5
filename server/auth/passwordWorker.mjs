/**
 * Worker-thread task for the password pool (server/auth/passwordPool.ts): one bcrypt hash or
 * compare per call, so the costly work never runs on the thread that answers requests.
 * Plain JavaScript on purpose: a worker thread loads it with no TypeScript loader, the same
 * way under `tsx`, vitest and the command line.
 */
import bcrypt from 'bcryptjs';

/** @param {{ op: 'hash', plain: string, cost: number } | { op: 'compare', plain: string, hash: string }} task */
export default function passwordTask(task) {
  if (task.op === 'hash') return bcrypt.hashSync(task.plain, task.cost);
  if (task.op === 'compare') return bcrypt.compareSync(task.plain, task.hash);
  throw new Error(`unknown password task ${String(task.op)}`);
}
