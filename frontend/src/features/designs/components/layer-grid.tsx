import { elementAt, pickableMaterials } from '@quietglass/shared';
import AddOutlined from '@mui/icons-material/AddOutlined';
import ArrowDownwardOutlined from '@mui/icons-material/ArrowDownwardOutlined';
import ArrowUpwardOutlined from '@mui/icons-material/ArrowUpwardOutlined';
import ContentCopyOutlined from '@mui/icons-material/ContentCopyOutlined';
import ContentPasteOutlined from '@mui/icons-material/ContentPasteOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import RepeatOutlined from '@mui/icons-material/RepeatOutlined';
import SwapVertOutlined from '@mui/icons-material/SwapVertOutlined';
import VerticalAlignTopOutlined from '@mui/icons-material/VerticalAlignTopOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Alert from '@mui/material/Alert';
import Checkbox from '@mui/material/Checkbox';
import IconButton from '@mui/material/IconButton';
import ToggleButton from '@mui/material/ToggleButton';
import ToggleButtonGroup from '@mui/material/ToggleButtonGroup';
import Typography from '@mui/material/Typography';
import {
  DataGrid,
  GridCellEditStartReasons,
  GridEditSingleSelectCell,
  useGridApiContext,
  useGridApiRef,
  type GridColDef,
  type GridRenderEditCellParams,
  type GridRowSelectionModel,
} from '@mui/x-data-grid';
import { useMemo, useState, type ClipboardEvent, type ReactNode } from 'react';
import { parseNumberInput, fieldText } from '../../../lib/format';
import {
  emptyRow,
  formatQwot,
  formatThickness,
  insertRow,
  looksLikeRows,
  materialProblem,
  parsePastedRows,
  periodRows,
  reverseBlock,
  THICKNESS_UNIT_LABELS,
  type ThicknessUnit,
  moveRow,
  newRowId,
  parsedThickness,
  qwotOfRow,
  qwotProblem,
  thicknessForQwot,
  thicknessProblem,
  type LayerRow,
  type LibraryMaterial,
} from '../layers';
import { PasteRowsDialog } from './paste-rows-dialog';
import { PeriodDialog, ReverseDialog } from './block-dialogs';

type GridRow = LayerRow & { order: number };

interface LayerGridProps {
  rows: LayerRow[];
  onRowsChange: (rows: LayerRow[]) => void;
  materials: readonly LibraryMaterial[];
  /** Reference wavelength for QWOT, nm; null while the header's value is invalid. */
  referenceWavelengthNm: number | null;
  readOnly: boolean;
}

/** Cell content with its problem underneath, in words (for sighted and screen-reader users alike). */
function CellWithProblem({ children, problem }: { children: ReactNode; problem: string | null }) {
  if (!problem) return <>{children}</>;
  return (
    <Box sx={{ display: 'flex', flexDirection: 'column', lineHeight: 1.25, py: 0.5, minWidth: 0 }}>
      <Box component="span" sx={{ color: 'error.main', fontWeight: 500 }}>
        {children}
      </Box>
      <Typography variant="caption" color="error" sx={{ whiteSpace: 'normal' }}>
        {problem}
      </Typography>
    </Box>
  );
}

/**
 * The material picker of a cell: choosing a material with the mouse commits it, as Enter would.
 * A choice made with Enter is committed by the grid itself (committing it here as well would stop
 * an edit that is no longer open).
 */
function MaterialEditCell(props: GridRenderEditCellParams<GridRow>) {
  const apiRef = useGridApiContext();
  return (
    <GridEditSingleSelectCell
      {...props}
      onValueChange={(event) => {
        if ('key' in event && event.key) return;
        if (apiRef.current.getCellMode(props.id, props.field) !== 'edit') return;
        apiRef.current.stopCellEditMode({ id: props.id, field: props.field });
      }}
    />
  );
}

/** Toolbar actions shown as icons (named by their label for assistive technology and as a tooltip). */
const ICON_ONLY = new Set(['Insert above', 'Duplicate', 'Delete', 'Move up', 'Move down']);

/** The editable columns in Tab order. */
export const EDITABLE_FIELDS = ['materialId', 'thicknessNm', 'qwot', 'notes'] as const;

/**
 * The cell Tab (or Shift+Tab) moves to from `field` of row `rowIndex`: the next editable cell of
 * the row, then the first of the next row; null past either end of the grid.
 */
export function nextEditableCell(
  rowIndex: number,
  field: string,
  rowCount: number,
  backwards: boolean,
): { rowIndex: number; field: (typeof EDITABLE_FIELDS)[number] } | null {
  const n = EDITABLE_FIELDS.length;
  const at = EDITABLE_FIELDS.indexOf(field as (typeof EDITABLE_FIELDS)[number]);
  let next = at < 0 ? (backwards ? n : -1) : at;
  let row = rowIndex;
  next += backwards ? -1 : 1;
  if (next >= n) {
    next = 0;
    row += 1;
  } else if (next < 0) {
    next = n - 1;
    row -= 1;
  }
  if (row < 0 || row >= rowCount) return null;
  return { rowIndex: row, field: elementAt(EDITABLE_FIELDS, next, 'the editable fields') };
}

/**
 * The Layer grid: the editable stack table, incident side first. Physical thickness and QWOT at
 * the reference wavelength stay in step (QWOT = 4·n(λref)·d/λref); bad cells keep what was typed
 * and say what is wrong. Cells edit with Enter (or by typing), Tab moves on, Escape cancels.
 */
export function LayerGrid({
  rows,
  onRowsChange,
  materials,
  referenceWavelengthNm,
  readOnly,
}: LayerGridProps) {
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [pasting, setPasting] = useState(false);
  const [blockDialog, setBlockDialog] = useState<'period' | 'reverse' | null>(null);
  const [unit, setUnit] = useState<ThicknessUnit>('nm');
  const [pasteProblems, setPasteProblems] = useState<string[]>([]);
  const apiRef = useGridApiRef();
  const materialsById = useMemo(() => new Map(materials.map((m) => [m.id, m])), [materials]);
  const gridRows = useMemo<GridRow[]>(() => rows.map((row, i) => ({ ...row, order: i + 1 })), [rows]);
  const selectedIndex = rows.findIndex((r) => r.id === selectedId);
  const selected = selectedIndex >= 0 ? rows[selectedIndex] : null;

  const columns = useMemo<GridColDef<GridRow>[]>(
    () => [
      { field: 'order', headerName: '#', width: 48, sortable: false, type: 'number' },
      {
        field: 'materialId',
        headerName: 'Material',
        width: 140,
        editable: !readOnly,
        sortable: false,
        type: 'singleSelect',
        valueOptions: pickableMaterials(
          materials,
          rows.map((r) => r.materialId),
        ).map((m) => ({ value: m.id, label: m.name })),
        renderEditCell: (params) => <MaterialEditCell {...params} />,
        renderCell: ({ row }) => {
          const problem = materialProblem(row, materialsById);
          const name =
            row.materialId === null ? '—' : (materialsById.get(row.materialId)?.name ?? `#${row.materialId}`);
          return <CellWithProblem problem={problem}>{name}</CellWithProblem>;
        },
      },
      {
        field: 'thicknessNm',
        headerName: 'Thickness (nm)',
        width: 130,
        editable: !readOnly,
        sortable: false,
        valueSetter: (value: unknown, row) => ({
          ...row,
          thicknessNm: fieldText(value).trim(),
          qwotInput: null,
        }),
        renderCell: ({ row }) => {
          if (row.qwotInput !== null) return '—';
          const problem = thicknessProblem(row.thicknessNm);
          const value = parsedThickness(row);
          return (
            <CellWithProblem problem={problem}>
              {value === null ? row.thicknessNm || '—' : formatThickness(value)}
            </CellWithProblem>
          );
        },
      },
      {
        field: 'qwot',
        headerName: 'QWOT',
        width: 100,
        editable: !readOnly,
        sortable: false,
        valueGetter: (_value, row) => {
          if (row.qwotInput !== null) return row.qwotInput;
          const qwot = qwotOfRow(row, materialsById.get(row.materialId ?? -1), referenceWavelengthNm);
          return qwot === null ? '' : formatQwot(qwot);
        },
        valueSetter: (value: unknown, row) => {
          const text = fieldText(value).trim();
          // An empty QWOT cell (left without typing) keeps the thickness.
          if (text === '') return row;
          // An unchanged cell (edit opened and left) keeps the exact thickness behind the rounded QWOT.
          const shown = qwotOfRow(row, materialsById.get(row.materialId ?? -1), referenceWavelengthNm);
          if (row.qwotInput === null && shown !== null && text === formatQwot(shown)) return row;
          const qwot = qwotProblem(text) === null ? parseNumberInput(text) : null;
          const nm =
            qwot === null
              ? null
              : thicknessForQwot(materialsById.get(row.materialId ?? -1), qwot, referenceWavelengthNm);
          return nm === null
            ? { ...row, qwotInput: text }
            : { ...row, thicknessNm: String(nm), qwotInput: null };
        },
        renderCell: ({ row, value }) => {
          if (row.qwotInput !== null) {
            const problem = qwotProblem(row.qwotInput) ?? 'needs a valid material and reference wavelength';
            return <CellWithProblem problem={problem}>{row.qwotInput}</CellWithProblem>;
          }
          return (value as string) || '—';
        },
      },
      {
        field: 'locked',
        headerName: 'Locked',
        width: 76,
        sortable: false,
        renderCell: ({ row }) => (
          <Checkbox
            size="small"
            checked={row.locked}
            disabled={readOnly}
            onChange={(event) =>
              onRowsChange(rows.map((r) => (r.id === row.id ? { ...r, locked: event.target.checked } : r)))
            }
            slotProps={{ input: { 'aria-label': `Lock layer ${row.order}` } }}
          />
        ),
      },
      { field: 'notes', headerName: 'Notes', flex: 1, minWidth: 120, editable: !readOnly, sortable: false },
    ],
    [materials, materialsById, readOnly, referenceWavelengthNm, rows, onRowsChange],
  );

  const selectionModel = useMemo<GridRowSelectionModel>(
    () => ({ type: 'include', ids: new Set(selectedId ? [selectedId] : []) }),
    [selectedId],
  );

  const replace = (next: LayerRow[], select: string | null = selectedId) => {
    onRowsChange(next);
    setSelectedId(select);
  };
  const defaultMaterial = selected?.materialId ?? rows[rows.length - 1]?.materialId ?? null;

  const actions: { label: string; icon: ReactNode; disabled: boolean; run: () => void }[] = [
    {
      label: 'Add layer',
      icon: <AddOutlined />,
      disabled: false,
      run: () => {
        const row = emptyRow(defaultMaterial);
        replace([...rows, row], row.id);
      },
    },
    {
      label: 'Insert above',
      icon: <VerticalAlignTopOutlined />,
      disabled: !selected,
      run: () => {
        const row = emptyRow(defaultMaterial);
        replace(insertRow(rows, selectedIndex, row), row.id);
      },
    },
    {
      label: 'Duplicate',
      icon: <ContentCopyOutlined />,
      disabled: !selected,
      run: () => {
        if (!selected) return;
        const copy = { ...selected, id: newRowId() };
        replace(insertRow(rows, selectedIndex + 1, copy), copy.id);
      },
    },
    {
      label: 'Delete',
      icon: <DeleteOutlined />,
      disabled: !selected,
      run: () => {
        const next = rows.filter((r) => r.id !== selectedId);
        replace(next, next[Math.min(selectedIndex, next.length - 1)]?.id ?? null);
      },
    },
    {
      label: 'Move up',
      icon: <ArrowUpwardOutlined />,
      disabled: !selected || selectedIndex === 0,
      run: () => selectedId && replace(moveRow(rows, selectedId, -1)),
    },
    {
      label: 'Move down',
      icon: <ArrowDownwardOutlined />,
      disabled: !selected || selectedIndex === rows.length - 1,
      run: () => selectedId && replace(moveRow(rows, selectedId, 1)),
    },
    {
      label: 'Paste rows…',
      icon: <ContentPasteOutlined />,
      disabled: false,
      run: () => setPasting(true),
    },
    {
      label: 'Insert period…',
      icon: <RepeatOutlined />,
      disabled: materials.length === 0,
      run: () => setBlockDialog('period'),
    },
    {
      label: 'Reverse block…',
      icon: <SwapVertOutlined />,
      disabled: rows.length < 2,
      run: () => setBlockDialog('reverse'),
    },
  ];

  /** Rows pasted into the grid go after the selected layer (else at the end). */
  const insertPasted = (pasted: LayerRow[]) => {
    const last = pasted.at(-1);
    if (!last) return;
    const at = selected ? selectedIndex + 1 : rows.length;
    replace([...rows.slice(0, at), ...pasted, ...rows.slice(at)], last.id);
  };

  // Ctrl+V of a block of rows anywhere on the grid (not inside a cell being edited) adds them.
  const onPaste = (event: ClipboardEvent<HTMLDivElement>) => {
    if (readOnly) return;
    const target = event.target as HTMLElement;
    if (['INPUT', 'TEXTAREA'].includes(target.tagName) || target.isContentEditable) return;
    const text = event.clipboardData.getData('text/plain');
    if (!looksLikeRows(text)) {
      // One value into the focused cell: opens its editor with the value, Enter commits it.
      const focus = apiRef.current?.state.focus.cell;
      if (
        focus &&
        (EDITABLE_FIELDS as readonly string[]).includes(focus.field) &&
        focus.field !== 'materialId'
      ) {
        event.preventDefault();
        apiRef.current?.startCellEditMode({ id: focus.id, field: focus.field, initialValue: text.trim() });
      }
      return;
    }
    event.preventDefault();
    const result = parsePastedRows(text, materials, { unit, referenceNm: referenceWavelengthNm });
    if (!result.ok) {
      setPasteProblems(result.problems);
      return;
    }
    setPasteProblems([]);
    insertPasted(result.rows);
  };

  return (
    <Box onPaste={onPaste}>
      {!readOnly && (
        <Box
          role="toolbar"
          aria-label="Layer tools"
          sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, mb: 1 }}
        >
          {actions.map((action) =>
            ICON_ONLY.has(action.label) ? (
              <IconButton
                key={action.label}
                size="small"
                aria-label={action.label}
                title={action.label}
                disabled={action.disabled}
                onClick={action.run}
                sx={{ border: 1, borderColor: 'divider', borderRadius: 1 }}
              >
                {action.icon}
              </IconButton>
            ) : (
              <Button
                key={action.label}
                size="small"
                variant="outlined"
                startIcon={action.icon}
                disabled={action.disabled}
                onClick={action.run}
              >
                {action.label}
              </Button>
            ),
          )}
          <ToggleButtonGroup
            size="small"
            exclusive
            title="Unit of pasted thicknesses when the rows have no header naming it"
            value={unit}
            onChange={(_e, value: ThicknessUnit | null) => value && setUnit(value)}
            aria-label="Pasted thickness unit"
          >
            {(Object.keys(THICKNESS_UNIT_LABELS) as ThicknessUnit[]).map((u) => (
              <ToggleButton key={u} value={u} sx={{ py: 0.25 }}>
                {THICKNESS_UNIT_LABELS[u]}
              </ToggleButton>
            ))}
          </ToggleButtonGroup>
        </Box>
      )}
      {pasteProblems.length > 0 && (
        <Alert severity="error" onClose={() => setPasteProblems([])} sx={{ mb: 1 }}>
          Nothing was pasted. Fix these rows and paste again:
          <ul aria-label="Paste problems" style={{ margin: '4px 0 0', paddingLeft: '1.25em' }}>
            {pasteProblems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        </Alert>
      )}
      <Box sx={{ maxHeight: 380, overflow: 'auto' }}>
        <DataGrid
          apiRef={apiRef}
          aria-label="Layer grid"
          rows={gridRows}
          columns={columns}
          autoHeight
          density="compact"
          hideFooter
          disableColumnMenu
          disableColumnFilter
          disableMultipleRowSelection
          rowSelectionModel={selectionModel}
          onRowSelectionModelChange={(model) =>
            setSelectedId(([...model.ids][0] as string | undefined) ?? null)
          }
          onCellEditStart={(params, event) => {
            // Ctrl+V on a cell is a paste into the grid (rows or one value), handled by onPaste.
            if (params.reason === GridCellEditStartReasons.pasteKeyDown) event.defaultMuiPrevented = true;
          }}
          onCellKeyDown={(params, event) => {
            if (event.key !== 'Tab' || readOnly) return;
            const rowIndex = gridRows.findIndex((r) => r.id === params.id);
            const next = nextEditableCell(rowIndex, params.field, gridRows.length, event.shiftKey);
            if (!next) return;
            event.preventDefault();
            event.defaultMuiPrevented = true;
            const editing = params.cellMode === 'edit';
            if (editing) void apiRef.current?.stopCellEditMode({ id: params.id, field: params.field });
            const id = elementAt(gridRows, next.rowIndex, 'the grid rows').id;
            apiRef.current?.setCellFocus(id, next.field);
            // Text cells open for typing at once; the material cell opens its list with Enter.
            if (editing && next.field !== 'materialId')
              apiRef.current?.startCellEditMode({ id, field: next.field });
          }}
          processRowUpdate={(updated) => {
            const { order: _order, ...row } = updated;
            onRowsChange(rows.map((r) => (r.id === row.id ? row : r)));
            return updated;
          }}
          localeText={{
            noRowsLabel: readOnly ? 'This version has no layers' : 'No layers yet: add one or paste rows',
          }}
          sx={{ '& .MuiDataGrid-cell': { display: 'flex', alignItems: 'center' } }}
        />
      </Box>
      <PasteRowsDialog
        open={pasting}
        materials={materials}
        onClose={() => setPasting(false)}
        unit={unit}
        referenceWavelengthNm={referenceWavelengthNm}
        onPaste={insertPasted}
      />
      <PeriodDialog
        open={blockDialog === 'period'}
        materials={materials}
        referenceWavelengthNm={referenceWavelengthNm}
        onClose={() => setBlockDialog(null)}
        onInsert={(high, low, count) => insertPasted(periodRows(high, low, count))}
      />
      <ReverseDialog
        open={blockDialog === 'reverse'}
        rowCount={rows.length}
        initialFrom={selected ? selectedIndex + 1 : 1}
        onClose={() => setBlockDialog(null)}
        onReverse={(from, to) => replace(reverseBlock(rows, from - 1, to - 1))}
      />
    </Box>
  );
}
