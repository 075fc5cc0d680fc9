import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import { ApiError } from '../lib/api-client';

/**
 * A refused file import: nothing was saved, and every problem the API named (one per bad row) in
 * a list, or its message when it named none.
 */
export function FileProblemsAlert({ error }: { error: Error | null }) {
  if (!error) return null;
  const problems = error instanceof ApiError ? error.details : [];
  return (
    <Alert severity="error" role="alert">
      <AlertTitle>Nothing was saved</AlertTitle>
      {problems.length > 0 ? (
        <>
          The file has {problems.length} problem{problems.length === 1 ? '' : 's'}:
          <ul aria-label="Problems in the file" style={{ margin: '4px 0 0', paddingLeft: '1.25em' }}>
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </>
      ) : (
        error.message
      )}
    </Alert>
  );
}
