import AddOutlined from '@mui/icons-material/AddOutlined';
import Button from '@mui/material/Button';
import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { PageHeader } from '../../components/page-header';
import { useSignedInUser } from '../../features/auth/signed-in-user';
import { useCustomers } from '../../features/customers/api/get-customers';
import { useNewCustomerPicker } from '../../features/customers/components/use-new-customer-picker';
import { DesignsGrid } from '../../features/designs/components/designs-grid';
import { NewDesignDialog } from '../../features/designs/components/new-design-dialog';
import { useMaterials } from '../../features/materials/api/get-materials';
import { useSpecMasks } from '../../features/spec-masks/api/get-spec-masks';
import { isDesigner } from '../../lib/roles';

export function DesignsRoute() {
  const user = useSignedInUser();
  const canEdit = isDesigner(user.role);
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);
  // What the "New design" dialog offers; fetched only for those who may create designs.
  const customers = useCustomers();
  const newCustomer = useNewCustomerPicker();
  const masks = useSpecMasks({}, { enabled: canEdit });
  const materials = useMaterials();
  const ready = Boolean(customers.data && masks.data && materials.data);

  return (
    <>
      <PageHeader
        title="Stack designs"
        description="Layer stacks for customers' parts, each with its versions from draft to release."
        actions={
          canEdit && (
            <Button
              variant="contained"
              startIcon={<AddOutlined />}
              disabled={!ready}
              onClick={() => setCreating(true)}
            >
              New design
            </Button>
          )
        }
      />
      <DesignsGrid />
      {creating && customers.data && masks.data && materials.data && (
        <NewDesignDialog
          open
          onClose={() => setCreating(false)}
          onCreated={(design) => void navigate(`/designs/${design.id}`)}
          customers={customers.data}
          specMasks={masks.data}
          materials={materials.data}
          onNewCustomer={newCustomer.open}
        />
      )}
      {newCustomer.dialog}
    </>
  );
}
