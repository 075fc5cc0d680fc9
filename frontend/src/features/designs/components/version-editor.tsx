import Alert from '@mui/material/Alert';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Chip from '@mui/material/Chip';
import Paper from '@mui/material/Paper';
import Tab from '@mui/material/Tab';
import Tabs from '@mui/material/Tabs';
import Typography from '@mui/material/Typography';
import type { DesignVersionContent, DesignVersionView, LimitBand, NamedModel } from '@quietglass/shared';
import { useEffect, useId, useMemo, useRef, useState, type ReactNode } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { useBlocker } from 'react-router-dom';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { ApiError } from '../../../lib/api-client';
import { formatDateTime } from '../../../lib/format';
import { notify } from '../../../lib/notifier';
import { useUndoable } from '../../../lib/undo-history';
import { useCreateDesignVersion } from '../api/create-design-version';
import { useSaveDesignVersion } from '../api/save-design-version';
import { useSubmitDesignVersion } from '../api/submit-design-version';
import { contentOf, headerProblems, headerValuesOf, referenceOf, type HeaderValues } from '../header';
import {
  describeProblem,
  layerProblems,
  layersFromRows,
  rowsFromLayers,
  type LayerRow,
  type LibraryMaterial,
} from '../layers';
import { CompareVersionsPanel } from './compare-versions-panel';
import { IndexProfileStrip } from './index-profile-strip';
import { LayerGrid } from './layer-grid';
import { PreviewPanel } from './preview-panel';
import { StackFileActions } from './stack-file-actions';
import { VersionHeaderFields } from './version-header-fields';

/** A tab of the workspace below the grid and the plot (Full analysis, Optimise, Approval …). */
export interface WorkspaceTab {
  key: string;
  label: string;
  content: ReactNode;
}

/** The tabs the editor has itself, before the ones it is given. */
const OWN_TABS = [
  { key: 'setup', label: 'Stack setup' },
  { key: 'compare', label: 'Compare' },
] as const;

interface VersionEditorProps {
  /** The design's name, for exported files. */
  designName: string;
  /** The workspace's version picker, shown at the start of the status line. */
  versionPicker?: ReactNode;
  /** Further tabs (analysis, optimisation, approval and history), shown after Stack setup and Compare. */
  tabs?: readonly WorkspaceTab[];
  /** The open tab's key; the workspace keeps it so it survives a reload of the version. */
  tab: string;
  onTabChange: (key: string) => void;
  version: DesignVersionView;
  /** Every version of the design, for comparing. */
  versions: readonly { number: number; status: string }[];
  /** The materials library now (a draft or returned version uses it; a submitted one its frozen snapshot). */
  library: readonly LibraryMaterial[];
  maskBands: LimitBand[] | null;
  maskName: string | null;
  /** The signed-in user's role may change designs. */
  canEdit: boolean;
  /** Fetches the saved version again and shows it in place of the local grid. */
  onReload: () => Promise<void>;
  onVersionCreated: (number: number) => void;
  onDirtyChange: (dirty: boolean) => void;
}

/** The materials a version is computed with: its frozen snapshot once submitted, else the library. */
function versionMaterials(
  version: DesignVersionView,
  library: readonly LibraryMaterial[],
): LibraryMaterial[] {
  // A returned version is edited against the library again; submitting freezes a new snapshot.
  if (!version.materialsSnapshot || version.status === 'returned') return [...library];
  return Object.entries(version.materialsSnapshot).map(([id, m]) => ({
    id: Number(id),
    name: m.name,
    model: m.model,
  }));
}

function contentKey(version: DesignVersionView): string {
  return JSON.stringify(contentOf(headerValuesOf(version), version.layers));
}

/**
 * One version in the workspace: header fields, the Layer grid, save (with optimistic locking),
 * submit or start a new version, and the instant preview. A stale save shows the server's message
 * and a Reload that replaces the grid only after the user confirms.
 */
export function VersionEditor({
  designName,
  versionPicker,
  tabs = [],
  tab,
  onTabChange,
  version,
  versions,
  library,
  maskBands,
  maskName,
  canEdit,
  onReload,
  onVersionCreated,
  onDirtyChange,
}: VersionEditorProps) {
  const [baseline, setBaseline] = useState(version);
  const history = useUndoable<LayerRow[]>(() => rowsFromLayers(version.layers));
  const rows = history.value;
  const setRows = history.set;
  const { control, reset } = useForm<HeaderValues>({
    defaultValues: headerValuesOf(version),
    mode: 'onChange',
  });
  const header = useWatch({ control }) as HeaderValues;
  const [conflict, setConflict] = useState<string | null>(null);
  const [confirmReload, setConfirmReload] = useState(false);
  const [reloading, setReloading] = useState(false);
  const [confirmSubmit, setConfirmSubmit] = useState(false);
  const save = useSaveDesignVersion();
  const submit = useSubmitDesignVersion();
  const startVersion = useCreateDesignVersion();
  const reasonId = useId();

  // A returned version is edited in place and submitted again; the other statuses are frozen.
  const editable = canEdit && (baseline.status === 'draft' || baseline.status === 'returned');
  const materials = useMemo(() => versionMaterials(baseline, library), [baseline, library]);
  const materialsById = useMemo(() => new Map(materials.map((m) => [m.id, m])), [materials]);
  const models = useMemo(
    () =>
      new Map<number, NamedModel>(
        materials.map((m) => [m.id, { name: m.name, model: m.model, rangeNm: m.rangeNm }]),
      ),
    [materials],
  );

  const problems = useMemo(
    () => [...headerProblems(header), ...layerProblems(rows, materialsById).map(describeProblem)],
    [header, rows, materialsById],
  );
  const draftKey = problems.length === 0 ? JSON.stringify(contentOf(header, layersFromRows(rows))) : null;
  // Keyed by its JSON so the preview recomputes when the content changes, not on every render.
  const content = useMemo(
    () => (draftKey ? (JSON.parse(draftKey) as DesignVersionContent) : null),
    [draftKey],
  );
  const dirty = draftKey !== contentKey(baseline);

  useEffect(() => onDirtyChange(dirty), [dirty, onDirtyChange]);
  useEffect(() => {
    if (!dirty) return;
    const warn = (event: BeforeUnloadEvent) => event.preventDefault();
    window.addEventListener('beforeunload', warn);
    return () => window.removeEventListener('beforeunload', warn);
  }, [dirty]);

  // Leaving the page inside the app asks first, like closing the tab does (the version picker, which
  // only changes the address's ?version=, asks through the workspace's own dialog).
  const blocker = useBlocker(
    ({ currentLocation, nextLocation }) =>
      dirty && editable && currentLocation.pathname !== nextLocation.pathname,
  );

  /** Why Save is disabled, shown beside it; null when it is enabled (or not offered). */
  const saveBlocked = !editable
    ? null
    : problems.length > 0
      ? `Cannot save: ${problems.slice(0, 3).join('; ')}${problems.length > 3 ? ` (and ${problems.length - 3} more)` : ''}`
      : dirty
        ? null
        : 'No unsaved changes';

  const doSave = () => {
    if (!content) return;
    setConflict(null);
    save.mutate(
      { designId: baseline.designId, number: baseline.number, content, rowVersion: baseline.rowVersion },
      {
        onSuccess: (saved) => {
          setBaseline(saved);
          reset(headerValuesOf(saved));
          notify(`Version ${saved.number} saved.`, 'success');
        },
        onError: (error) => {
          if (error instanceof ApiError && error.status === 409) setConflict(error.message);
        },
      },
    );
  };

  const doReload = async () => {
    setReloading(true);
    try {
      await onReload();
    } finally {
      setReloading(false);
      setConfirmReload(false);
    }
  };

  const doSubmit = () => {
    submit.mutate(
      { designId: baseline.designId, number: baseline.number, rowVersion: baseline.rowVersion },
      {
        onSuccess: (submitted) => {
          setBaseline(submitted);
          setConfirmSubmit(false);
          notify(`Version ${submitted.number} submitted for approval.`, 'success');
        },
        onError: (error) => {
          setConfirmSubmit(false);
          if (error instanceof ApiError && error.status === 409) setConflict(error.message);
        },
      },
    );
  };

  const otherError = [save.error, submit.error].find(
    (e) => e && !(e instanceof ApiError && e.status === 409),
  );

  const allTabs = [...OWN_TABS, ...tabs];
  const openTab = allTabs.some((t) => t.key === tab) ? tab : OWN_TABS[0].key;

  // Keyboard shortcuts of the workspace; the latest handlers are read through a ref.
  const shortcuts = useRef({ save: () => {}, undo: () => {}, redo: () => {}, tab: (_i: number) => {} });
  shortcuts.current = {
    save: () => {
      if (editable && saveBlocked === null) doSave();
    },
    undo: () => editable && history.undo(),
    redo: () => editable && history.redo(),
    tab: (i) => {
      const target = allTabs[i];
      if (target) onTabChange(target.key);
    },
  };
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      const target = event.target as HTMLElement | null;
      const typing =
        !!target && (target.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(target.tagName));
      const mod = event.ctrlKey || event.metaKey;
      const key = event.key.toLowerCase();
      if (mod && key === 's') {
        event.preventDefault();
        shortcuts.current.save();
      } else if (mod && !typing && key === 'z') {
        event.preventDefault();
        if (event.shiftKey) shortcuts.current.redo();
        else shortcuts.current.undo();
      } else if (mod && !typing && key === 'y') {
        event.preventDefault();
        shortcuts.current.redo();
      } else if (event.altKey && !mod && /^Digit[1-9]$/.test(event.code)) {
        event.preventDefault();
        shortcuts.current.tab(Number(event.code.slice(5)) - 1);
      }
    };
    document.addEventListener('keydown', onKey);
    return () => document.removeEventListener('keydown', onKey);
  }, []);

  const tabContent = (key: string): ReactNode => {
    if (key === 'setup')
      return <VersionHeaderFields control={control} materials={materials} disabled={!editable} />;
    if (key === 'compare')
      return (
        <CompareVersionsPanel
          designId={baseline.designId}
          versions={versions}
          current={{ number: baseline.number, content }}
          library={library}
          maskBands={maskBands}
        />
      );
    return tabs.find((t) => t.key === key)?.content ?? null;
  };

  return (
    <Box sx={{ display: 'grid', gap: 1.5 }}>
      <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
        {versionPicker}
        <Typography variant="body2" color="text.secondary">
          Version {baseline.number} by {baseline.createdBy.displayName}, last saved{' '}
          {formatDateTime(baseline.updatedAt)}
        </Typography>
        <Chip
          size="small"
          label={baseline.status}
          color={baseline.status === 'draft' ? 'default' : 'primary'}
        />
        {dirty && editable && <Chip size="small" color="warning" label="Unsaved changes" />}
        {editable && (
          <>
            <Box sx={{ flex: 1 }} />
            <Button
              size="small"
              onClick={history.undo}
              disabled={!history.canUndo}
              title="Undo the last change to the grid (Ctrl+Z)"
            >
              Undo
            </Button>
            <Button
              size="small"
              onClick={history.redo}
              disabled={!history.canRedo}
              title="Redo (Ctrl+Shift+Z)"
            >
              Redo
            </Button>
            <Button
              variant="contained"
              size="small"
              onClick={doSave}
              disabled={saveBlocked !== null}
              loading={save.isPending}
              aria-describedby={saveBlocked ? reasonId : undefined}
              title="Save (Ctrl+S)"
            >
              Save
            </Button>
            <Button
              variant="outlined"
              size="small"
              onClick={() => setConfirmSubmit(true)}
              disabled={dirty || baseline.layers.length === 0}
              title={dirty ? 'Save your changes before submitting' : undefined}
            >
              Submit for approval
            </Button>
          </>
        )}
      </Box>
      {editable && saveBlocked && (
        <Typography
          id={reasonId}
          variant="body2"
          color={problems.length > 0 ? 'error' : 'text.secondary'}
          sx={{ textAlign: 'right', mt: -1 }}
        >
          {saveBlocked}
        </Typography>
      )}
      {!editable && canEdit && (
        <Alert
          severity="info"
          action={
            <Button
              color="inherit"
              size="small"
              loading={startVersion.isPending}
              onClick={() =>
                startVersion.mutate(
                  { designId: baseline.designId, fromNumber: baseline.number },
                  {
                    onSuccess: (created) => {
                      notify(`Version ${created.number} started from version ${baseline.number}.`, 'success');
                      onVersionCreated(created.number);
                    },
                  },
                )
              }
            >
              Start new version
            </Button>
          }
        >
          Version {baseline.number} is {baseline.status} and read-only. Start a new version from it to make
          changes.
        </Alert>
      )}
      {!canEdit && (
        <Alert severity="info">You can read this design; engineers and administrators change it.</Alert>
      )}
      {conflict && <ConflictAlert message={conflict} onReload={() => setConfirmReload(true)} />}
      {otherError && <ErrorAlert error={otherError} title="Not saved" />}
      <Box
        sx={{
          display: 'grid',
          gap: 2,
          alignItems: 'start',
          gridTemplateColumns: { xs: 'minmax(0, 1fr)', lg: 'minmax(0, 1fr) minmax(0, 1fr)' },
        }}
      >
        <Paper variant="outlined" sx={{ p: 1.5 }} component="section" aria-label="Layers">
          <Box sx={{ display: 'flex', alignItems: 'baseline', gap: 1.5, mb: 0.5 }}>
            <Typography variant="h2" component="h2">
              Layer grid
            </Typography>
            <Typography variant="caption" color="text.secondary">
              Incident side first; the last row sits on the substrate.
            </Typography>
          </Box>
          <StackFileActions
            designName={designName}
            version={baseline}
            content={content}
            unsaved={dirty}
            models={models}
            library={library}
            canImport={canEdit}
            onVersionCreated={onVersionCreated}
          />
          <LayerGrid
            rows={rows}
            onRowsChange={setRows}
            materials={materials}
            referenceWavelengthNm={referenceOf(header)}
            readOnly={!editable}
          />
          <IndexProfileStrip rows={rows} materials={materials} referenceWavelengthNm={referenceOf(header)} />
        </Paper>
        <PreviewPanel
          designId={baseline.designId}
          content={content}
          waitingReason={problems[0] ?? null}
          materials={models}
          maskBands={maskBands}
          maskName={maskName}
        />
      </Box>
      <Paper variant="outlined" component="section" aria-label="Workspace tabs">
        <Tabs
          value={openTab}
          onChange={(_e, key: string) => onTabChange(key)}
          variant="scrollable"
          aria-label="Workspace"
          sx={{ borderBottom: 1, borderColor: 'divider', px: 1 }}
        >
          {allTabs.map((t, i) => (
            <Tab
              key={t.key}
              value={t.key}
              label={t.label}
              id={`workspace-tab-${t.key}`}
              aria-controls={`workspace-panel-${t.key}`}
              title={i < 9 ? `Alt+${i + 1}` : undefined}
            />
          ))}
        </Tabs>
        {allTabs.map((t) => (
          // Every tab stays mounted so a running job or a half-filled form survives switching tabs.
          <Box
            key={t.key}
            role="tabpanel"
            id={`workspace-panel-${t.key}`}
            aria-labelledby={`workspace-tab-${t.key}`}
            hidden={t.key !== openTab}
            sx={{ p: 2 }}
          >
            {tabContent(t.key)}
          </Box>
        ))}
        <Typography variant="caption" color="text.secondary" component="p" sx={{ px: 2, pb: 1 }}>
          Shortcuts: Ctrl+S save · Ctrl+Z undo · Ctrl+Shift+Z redo · Ctrl+V paste rows into the grid · Alt+1…
          {Math.min(9, allTabs.length)} open a tab
        </Typography>
      </Paper>
      <ConfirmDialog
        open={confirmReload}
        title="Replace your grid with the saved version?"
        confirmLabel="Replace with saved version"
        cancelLabel="Keep my changes"
        pending={reloading}
        onConfirm={() => void doReload()}
        onCancel={() => setConfirmReload(false)}
      >
        The grid has {rows.length} layer{rows.length === 1 ? '' : 's'} with your unsaved edits. Reloading
        shows the version as it is saved now and discards your edits; keep them if you want to copy them
        elsewhere first.
      </ConfirmDialog>
      <ConfirmDialog
        open={blocker.state === 'blocked'}
        title="Leave with unsaved changes?"
        confirmLabel="Discard and leave"
        cancelLabel="Stay here"
        onConfirm={() => blocker.proceed?.()}
        onCancel={() => blocker.reset?.()}
      >
        The grid of version {baseline.number} has unsaved changes. Leaving this page discards them; stay to
        save them first.
      </ConfirmDialog>
      <ConfirmDialog
        open={confirmSubmit}
        title={`Submit version ${baseline.number} for approval?`}
        confirmLabel="Submit"
        pending={submit.isPending}
        onConfirm={doSubmit}
        onCancel={() => setConfirmSubmit(false)}
      >
        A submitted version cannot change. Further edits go into a new version.
      </ConfirmDialog>
    </Box>
  );
}
