import AddOutlined from '@mui/icons-material/AddOutlined';
import ArrowDownwardOutlined from '@mui/icons-material/ArrowDownwardOutlined';
import ArrowUpwardOutlined from '@mui/icons-material/ArrowUpwardOutlined';
import ContentCopyOutlined from '@mui/icons-material/ContentCopyOutlined';
import ContentPasteOutlined from '@mui/icons-material/ContentPasteOutlined';
import DeleteOutlined from '@mui/icons-material/DeleteOutlined';
import VerticalAlignTopOutlined from '@mui/icons-material/VerticalAlignTopOutlined';
import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Checkbox from '@mui/material/Checkbox';
import Typography from '@mui/material/Typography';
import {
  DataGrid,
  GridEditSingleSelectCell,
  useGridApiContext,
  type GridColDef,
  type GridRenderEditCellParams,
  type GridRowSelectionModel,
} from '@mui/x-data-grid';
import { useMemo, useState, type ReactNode } from 'react';
import { parseNumberInput } from '../../../lib/format';
import {
  emptyRow,
  formatQwot,
  formatThickness,
  insertRow,
  materialProblem,
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

/** The material picker of a cell: choosing a material commits it, as Enter would. */
function MaterialEditCell(props: GridRenderEditCellParams<GridRow>) {
  const apiRef = useGridApiContext();
  return (
    <GridEditSingleSelectCell
      {...props}
      onValueChange={async () => {
        await apiRef.current.stopCellEditMode({ id: props.id, field: props.field });
      }}
    />
  );
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
        valueOptions: materials.map((m) => ({ value: m.id, label: m.name })),
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
          thicknessNm: String(value ?? '').trim(),
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
          const text = String(value ?? '').trim();
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
  ];

  return (
    <Box>
      {!readOnly && (
        <Box
          role="toolbar"
          aria-label="Layer tools"
          sx={{ display: 'flex', flexWrap: 'wrap', gap: 1, mb: 1 }}
        >
          {actions.map((action) => (
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
          ))}
        </Box>
      )}
      <Box sx={{ maxHeight: 380, overflow: 'auto' }}>
        <DataGrid
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
        onPaste={(pasted) => {
          const at = selected ? selectedIndex + 1 : rows.length;
          replace([...rows.slice(0, at), ...pasted, ...rows.slice(at)], pasted[pasted.length - 1].id);
        }}
      />
    </Box>
  );
}
