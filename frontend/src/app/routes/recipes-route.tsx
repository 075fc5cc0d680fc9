import { PageHeader } from '../../components/page-header';
import { RecipesGrid } from '../../features/recipes/components/recipes-grid';

export function RecipesRoute() {
  return (
    <>
      <PageHeader
        title="Released recipes"
        description="Design versions approved and released for the chamber. Open one for its run sheet."
      />
      <RecipesGrid />
    </>
  );
}
