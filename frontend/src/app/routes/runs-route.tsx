import AddOutlined from '@mui/icons-material/AddOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { ErrorAlert } from '../../components/error-alert';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { useChambers } from '../../features/chambers/api/get-chambers';
import { useRecipes } from '../../features/recipes/api/get-recipes';
import { RunsGrid } from '../../features/runs/components/runs-grid';
import { StartRunDialog } from '../../features/runs/components/start-run-dialog';

export function RunsRoute() {
  const user = useSignedInUser();
  const navigate = useNavigate();
  const [params, setParams] = useSearchParams();
  const recipeParam = params.get('recipe');
  const [open, setOpen] = useState(recipeParam !== null);
  const recipes = useRecipes();
  const chambers = useChambers();
  const ready = recipes.data !== undefined && chambers.data !== undefined;

  const close = () => {
    setOpen(false);
    if (recipeParam !== null) setParams({}, { replace: true });
  };

  return (
    <>
      <PageHeader
        title="Chamber runs"
        description="Deposition runs of released recipes: readings, durability and measured spectra."
        actions={
          <Button
            variant="contained"
            startIcon={<AddOutlined />}
            onClick={() => setOpen(true)}
            disabled={!ready}
          >
            Start a run
          </Button>
        }
      />
      {recipes.isError && (
        <ErrorAlert error={recipes.error} title="The released recipes could not be loaded" />
      )}
      {chambers.isError && <ErrorAlert error={chambers.error} title="The chambers could not be loaded" />}
      <RunsGrid recipes={recipes.data} chambers={chambers.data} />
      {open && ready && (
        <StartRunDialog
          open
          recipes={recipes.data}
          chambers={chambers.data}
          operatorName={user.displayName}
          initialRecipe={recipeParam ?? undefined}
          onClose={close}
          onStarted={(run) => void navigate(`/runs/${run.id}`)}
        />
      )}
    </>
  );
}
