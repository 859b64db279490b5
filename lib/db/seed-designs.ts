import type { initModels } from "../../models";

type Models = ReturnType<typeof initModels>;

/** Demo designs arrive with the workbench; until then the workspace starts empty. */
export async function seedDemoDesigns(
  _models: Models,
  _workspace: InstanceType<Models["Workspace"]>,
  _users: Record<string, InstanceType<Models["User"]>>,
): Promise<void> {}
