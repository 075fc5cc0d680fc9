import type { ReleasedRecipeView } from './run-inputs';
import type { DurabilityResult } from './api/get-runs';

/** "Lens AR v2" for a recipe the list knows, "Design 12 v2" for one it does not (retired since). */
export function recipeLabel(
  recipes: readonly ReleasedRecipeView[] | undefined,
  designId: number,
  versionNumber: number,
): string {
  const recipe = recipes?.find((r) => r.designId === designId && r.number === versionNumber);
  return `${recipe ? recipe.name : `Design ${designId}`} v${versionNumber}`;
}

/** The option value of a recipe in the run dialog and the `?recipe=` address: "designId:number". */
export function recipeKey(designId: number, versionNumber: number): string {
  return `${designId}:${versionNumber}`;
}

export function parseRecipeKey(key: string | null): { designId: number; versionNumber: number } | null {
  const m = /^(\d+):(\d+)$/.exec(key?.trim() ?? '');
  return m ? { designId: Number(m[1]), versionNumber: Number(m[2]) } : null;
}

/** The run's durability outcome: Fail if any test failed, Pass if some were run and all passed. */
export function durabilityOutcome(results: readonly DurabilityResult[]): 'Pass' | 'Fail' | 'Not tested' {
  if (results.length === 0) return 'Not tested';
  return results.some((r) => r.result === 'fail') ? 'Fail' : 'Pass';
}
