import Alert from '@mui/material/Alert';
import AlertTitle from '@mui/material/AlertTitle';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import { useRef, useState } from 'react';
import {
  MAX_STACK_FILE_BYTES,
  designStackFile,
  draftFromStackFile,
  type DesignVersionContent,
  type DesignVersionView,
  type NamedModel,
} from '@quietglass/shared';
import { ErrorAlert } from '../../../components/error-alert';
import { downloadText } from '../../../lib/download';
import { notify } from '../../../lib/notifier';
import { useCreateDesignVersion } from '../api/create-design-version';
import type { LibraryMaterial } from '../layers';
import { formatSizeLimit } from '../../../lib/format';

interface StackFileActionsProps {
  designName: string;
  version: DesignVersionView;
  /** The grid's content as it stands (null while it has problems). */
  content: DesignVersionContent | null;
  /**
   * The grid differs from the saved version: the file would carry content under a version number
   * it was never saved as, so export waits for a save.
   */
  unsaved: boolean;
  /** Models the version computes with, by material id. */
  models: ReadonlyMap<number, NamedModel>;
  /** The library a file's materials are matched against by name. */
  library: readonly LibraryMaterial[];
  canImport: boolean;
  onVersionCreated: (number: number) => void;
}

/** `Lens AR / rev 2` → `Lens-AR-rev-2`: safe in a file name on every system. */
function fileStem(text: string): string {
  return text.replace(/[^\p{L}\p{N}._-]+/gu, '-').replace(/^-+|-+$/g, '') || 'design';
}

/**
 * The version as the stack file `npm run calc -- --stack FILE` reads, and such a file read back as
 * a new draft of this design (materials matched by name to the library; nothing is saved while
 * the file has a problem).
 */
export function StackFileActions({
  designName,
  version,
  content,
  unsaved,
  models,
  library,
  canImport,
  onVersionCreated,
}: StackFileActionsProps) {
  const input = useRef<HTMLInputElement>(null);
  const [problems, setProblems] = useState<{ file: string; list: string[] } | null>(null);
  const create = useCreateDesignVersion();

  const exportFile = () => {
    if (!content || unsaved) return;
    const file = designStackFile(content, models, {
      name: `${designName} version ${version.number}`,
      description: `Exported from Quietglass on ${new Date().toISOString().slice(0, 10)}; status ${version.status}.`,
    });
    downloadText(
      `${JSON.stringify(file, null, 2)}\n`,
      `${fileStem(designName)}-v${version.number}.stack.json`,
      'application/json',
    );
  };

  const importFile = async (file: File) => {
    setProblems(null);
    create.reset();
    if (file.size > MAX_STACK_FILE_BYTES) {
      setProblems({
        file: file.name,
        list: [`the file is larger than ${formatSizeLimit(MAX_STACK_FILE_BYTES)}`],
      });
      return;
    }
    let json: unknown;
    try {
      json = JSON.parse(await file.text());
    } catch (e) {
      setProblems({ file: file.name, list: [`not JSON: ${e instanceof Error ? e.message : String(e)}`] });
      return;
    }
    const read = draftFromStackFile(
      json,
      library.map((m) => ({ id: m.id, name: m.name, model: m.model, retired: Boolean(m.retiredAt) })),
      version,
    );
    if (!read.ok) {
      setProblems({ file: file.name, list: read.problems });
      return;
    }
    create.mutate(
      {
        designId: version.designId,
        fromNumber: version.number,
        content: read.content,
        sourceFile: file.name,
      },
      {
        onSuccess: (created) => {
          notify(`Version ${created.number} imported from ${file.name}.`, 'success');
          onVersionCreated(created.number);
        },
      },
    );
  };

  return (
    <Box sx={{ display: 'grid', gap: 1 }}>
      <Box sx={{ display: 'flex', gap: 1 }}>
        <Button
          size="small"
          onClick={exportFile}
          disabled={!content || unsaved}
          title={
            unsaved
              ? `Save your changes first: the file is exported as version ${version.number} as saved`
              : 'Download this version as a stack file for npm run calc'
          }
        >
          Export stack file
        </Button>
        {canImport && (
          <>
            <Button
              size="small"
              onClick={() => input.current?.click()}
              loading={create.isPending}
              title="Read a stack file as a new draft of this design"
            >
              Import stack file…
            </Button>
            <input
              ref={input}
              type="file"
              accept=".json,application/json"
              aria-label="Stack file to import"
              hidden
              onChange={(event) => {
                const chosen = event.target.files?.[0];
                event.target.value = '';
                if (chosen) void importFile(chosen);
              }}
            />
          </>
        )}
      </Box>
      {problems && (
        <Alert severity="error" role="alert" onClose={() => setProblems(null)}>
          <AlertTitle>Nothing was imported</AlertTitle>
          {problems.file} has {problems.list.length} problem{problems.list.length === 1 ? '' : 's'}:
          <ul aria-label="Problems in the stack file" style={{ margin: '4px 0 0', paddingLeft: '1.25em' }}>
            {problems.list.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </Alert>
      )}
      {create.error && <ErrorAlert error={create.error} title="Not imported" />}
    </Box>
  );
}
