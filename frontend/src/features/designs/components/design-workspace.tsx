import Box from '@mui/material/Box';
import MenuItem from '@mui/material/MenuItem';
import TextField from '@mui/material/TextField';
import type { DesignVersionView, DesignView, LimitBand } from '@quietglass/shared';
import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useState, type ReactNode } from 'react';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { ErrorAlert } from '../../../components/error-alert';
import { LoadingBlock } from '../../../components/loading-block';
import { getDesignQueryOptions } from '../api/get-design';
import {
  getDesignVersionQueryOptions,
  storeDesignVersion,
  useDesignVersion,
} from '../api/get-design-version';
import type { LibraryMaterial } from '../layers';
import { VersionEditor, type WorkspaceTab } from './version-editor';

interface DesignWorkspaceProps {
  design: DesignView;
  /** The version shown; the route keeps it in the address. */
  versionNumber: number;
  onVersionChange: (number: number) => void;
  library: readonly LibraryMaterial[];
  maskBands: LimitBand[] | null;
  maskName: string | null;
  canEdit: boolean;
  /**
   * The open version's approval steps and history, shown above the editor. `onTransitioned` takes
   * the version as the API returns it after a step, caches it and mounts the editor afresh.
   */
  approval?: (
    version: DesignVersionView,
    onTransitioned: (view: DesignVersionView) => Promise<void>,
  ) => ReactNode;
  /** Further tabs after Stack setup and Compare (Full analysis, Optimise); Approval & history comes last. */
  panels?: readonly WorkspaceTab[];
  /** The tab open at first (e.g. from a compute-queue link). */
  initialTab?: string | null;
}

/**
 * The version picker for the design, the open version's approval steps and history (`approval`) and its editor.
 * After an approval step the editor is mounted afresh so it shows the new status.
 */
export function DesignWorkspace({
  design,
  versionNumber,
  onVersionChange,
  library,
  maskBands,
  maskName,
  canEdit,
  approval,
  panels = [],
  initialTab = null,
}: DesignWorkspaceProps) {
  const [tab, setTab] = useState(initialTab ?? 'setup');
  const queryClient = useQueryClient();
  const version = useDesignVersion(design.id, versionNumber);
  const [loadCount, setLoadCount] = useState(0);
  const [dirty, setDirty] = useState(false);
  const [switchTo, setSwitchTo] = useState<number | null>(null);

  const reload = useCallback(async () => {
    await queryClient.fetchQuery({ ...getDesignVersionQueryOptions(design.id, versionNumber), staleTime: 0 });
    await queryClient.invalidateQueries({ queryKey: getDesignQueryOptions(design.id).queryKey, exact: true });
    setLoadCount((n) => n + 1);
  }, [queryClient, design.id, versionNumber]);

  const transitioned = useCallback(
    async (view: DesignVersionView) => {
      await storeDesignVersion(queryClient, view);
      setLoadCount((n) => n + 1);
    },
    [queryClient],
  );

  const choose = (number: number) => {
    if (number === versionNumber) return;
    if (dirty) setSwitchTo(number);
    else onVersionChange(number);
  };

  const versionPicker = (
    <TextField
      select
      size="small"
      label="Version"
      value={String(versionNumber)}
      onChange={(event) => choose(Number(event.target.value))}
      sx={{ width: 240 }}
    >
      {design.versions.map((v) => (
        <MenuItem key={v.number} value={String(v.number)}>
          Version {v.number} · {v.status} · {v.createdBy}
        </MenuItem>
      ))}
    </TextField>
  );

  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      {!version.data && versionPicker}
      {version.isPending && <LoadingBlock label="Loading the version" />}
      {version.isError && <ErrorAlert error={version.error} title="The version could not be loaded" />}
      {version.data && (
        <VersionEditor
          designName={design.name}
          versionPicker={versionPicker}
          tab={tab}
          onTabChange={setTab}
          tabs={[
            ...panels,
            ...(approval
              ? [
                  {
                    key: 'approval',
                    label: 'Approval & history',
                    content: approval(version.data, transitioned),
                  },
                ]
              : []),
          ]}
          key={`${version.data.number}:${loadCount}`}
          version={version.data}
          versions={design.versions}
          library={library}
          maskBands={maskBands}
          maskName={maskName}
          canEdit={canEdit}
          onReload={reload}
          onVersionCreated={(number) => {
            setDirty(false);
            onVersionChange(number);
          }}
          onDirtyChange={setDirty}
        />
      )}
      <ConfirmDialog
        open={switchTo !== null}
        title="Leave your unsaved changes?"
        confirmLabel="Discard and switch"
        cancelLabel="Stay on this version"
        onConfirm={() => {
          if (switchTo !== null) onVersionChange(switchTo);
          setDirty(false);
          setSwitchTo(null);
        }}
        onCancel={() => setSwitchTo(null)}
      >
        The grid of version {versionNumber} has unsaved changes. Switching to version {switchTo} discards
        them.
      </ConfirmDialog>
    </Box>
  );
}
