/** Reading jobs for the app: any member of the group may watch its jobs' progress. */
import { authorise, type Member } from "../access";
import { NotFoundError } from "../../engine/errors";
import { uuidOrNone } from "../samples";
import { getRun, jobPool, listRuns, type JobView } from "./runs";

/** The group's newest jobs (at most 20), newest first. */
export async function listJobs(member: Member): Promise<JobView[]> {
  authorise(member, "group.read");
  return listRuns(jobPool(), member.group.id);
}

/** One job of the group, or NotFoundError (also for another group's job). */
export async function jobStatus(member: Member, id: string): Promise<JobView> {
  authorise(member, "group.read");
  const run = await getRun(jobPool(), member.group.id, uuidOrNone(id));
  if (!run) throw new NotFoundError("job");
  return run;
}
