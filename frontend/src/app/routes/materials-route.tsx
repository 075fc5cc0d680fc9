import AddOutlined from '@mui/icons-material/AddOutlined';
import UploadFileOutlined from '@mui/icons-material/UploadFileOutlined';
import MenuBookOutlined from '@mui/icons-material/MenuBookOutlined';
import Box from '@mui/material/Box';
import FormControlLabel from '@mui/material/FormControlLabel';
import Switch from '@mui/material/Switch';
import Button from '@mui/material/Button';
import Typography from '@mui/material/Typography';
import { useState } from 'react';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { useMaterials, type MaterialView } from '../../features/materials/api/get-materials';
import { ConstantsFileDialog } from '../../features/materials/components/constants-file-dialog';
import { MaterialCsvDialog } from '../../features/materials/components/material-csv-dialog';
import { MaterialDetail } from '../../features/materials/components/material-detail';
import { MaterialFormDialog } from '../../features/materials/components/material-form-dialog';
import { MaterialsGrid } from '../../features/materials/components/materials-grid';
import { isDesigner } from '../../lib/roles';

export function MaterialsRoute() {
  const user = useSignedInUser();
  const canEdit = isDesigner(user.role);
  const materials = useMaterials();
  const [selectedId, setSelectedId] = useState<number | null>(null);
  const [editing, setEditing] = useState<MaterialView | 'new' | null>(null);
  const [uploading, setUploading] = useState(false);
  const [importing, setImporting] = useState(false);
  const [showRetired, setShowRetired] = useState(false);
  const selected = materials.data?.find((m) => m.id === selectedId) ?? null;

  return (
    <>
      <PageHeader
        title="Materials"
        description="Refractive index n and extinction coefficient k of the coating and substrate materials."
        actions={
          canEdit && (
            <>
              <Button variant="outlined" startIcon={<MenuBookOutlined />} onClick={() => setImporting(true)}>
                Import published constants
              </Button>
              <Button
                variant="outlined"
                startIcon={<UploadFileOutlined />}
                onClick={() => setUploading(true)}
              >
                Upload n,k file
              </Button>
              <Button variant="contained" startIcon={<AddOutlined />} onClick={() => setEditing('new')}>
                New material
              </Button>
            </>
          )
        }
      />
      <Box sx={{ display: 'grid', gap: 2 }}>
        <FormControlLabel
          control={<Switch checked={showRetired} onChange={(e) => setShowRetired(e.target.checked)} />}
          label="Show retired materials"
        />
        <MaterialsGrid
          selectedId={selectedId}
          showRetired={showRetired}
          onSelect={(m) => setSelectedId(m?.id ?? null)}
        />
        {selected ? (
          <MaterialDetail material={selected} canEdit={canEdit} onEdit={() => setEditing(selected)} />
        ) : (
          <Typography variant="body2" color="text.secondary">
            Choose a material to see its n and k.
          </Typography>
        )}
      </Box>
      {editing !== null && (
        <MaterialFormDialog
          key={editing === 'new' ? 'new' : `${editing.id}:${editing.version}`}
          open
          material={editing === 'new' ? null : editing}
          onClose={() => setEditing(null)}
          onSaved={(m) => setSelectedId(m.id)}
        />
      )}
      <ConstantsFileDialog
        open={importing}
        onClose={() => setImporting(false)}
        onSaved={(m) => setSelectedId(m.id)}
      />
      <MaterialCsvDialog
        open={uploading}
        onClose={() => setUploading(false)}
        onSaved={(m) => setSelectedId(m.id)}
      />
    </>
  );
}
