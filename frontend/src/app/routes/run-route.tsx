import type { Role } from '@quietglass/shared';
import { useParams } from 'react-router-dom';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { RunDiagnosisPanel } from '../../features/calculations/components/run-diagnosis-panel';
import { useChambers } from '../../features/chambers/api/get-chambers';
import { useRecipe } from '../../features/recipes/api/get-recipe';
import { useRun } from '../../features/runs/api/get-run';
import { RunPage } from '../../features/runs/components/run-page';
import { isDesigner } from '../../lib/roles';
import { NotFoundRoute } from './not-found-route';

export function RunRoute() {
  const user = useSignedInUser();
  const { id } = useParams();
  const runId = Number(id);
  if (!Number.isInteger(runId) || runId <= 0) return <NotFoundRoute />;
  return <ComposedRunPage key={runId} runId={runId} role={user.role} userId={user.id} />;
}

/** The run page with the recipe and chambers it names, and Run diagnosis for engineers and admins. */
function ComposedRunPage({ runId, role, userId }: { runId: number; role: Role; userId: number }) {
  // The run page reads the same query: the run is fetched once.
  const run = useRun(runId);
  const recipe = useRecipe(run.data?.designId ?? null, run.data?.versionNumber ?? null);
  const chambers = useChambers();
  const snapshot = recipe.data?.materialsSnapshot ?? {};
  const materialName = (materialId: number) => snapshot[String(materialId)]?.name ?? `Material ${materialId}`;

  return (
    <RunPage
      runId={runId}
      role={role}
      userId={userId}
      recipe={recipe}
      chambers={chambers.data}
      diagnosis={(spectrum) => (
        <RunDiagnosisPanel
          key={`diagnosis-${spectrum.id}`}
          spectrum={spectrum}
          layerCount={recipe.data?.layers.length ?? 0}
          materialName={materialName}
          canRun={isDesigner(role)}
        />
      )}
    />
  );
}
