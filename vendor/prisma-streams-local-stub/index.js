// Stand-in for @prisma/streams-local: the prisma CLI imports it only inside `prisma dev`
// (a local development database server), which Heatbook does not use (it runs its own
// embedded PostgreSQL). Anything that reaches it is told so instead of failing obscurely.
function unavailable() {
  throw new Error("@prisma/streams-local is replaced by a stand-in in Heatbook (package.json overrides): `prisma dev` is not supported; use `npm start`, which runs an embedded PostgreSQL");
}
export async function startLocalDurableStreamsServer() {
  unavailable();
}
export default { startLocalDurableStreamsServer };
