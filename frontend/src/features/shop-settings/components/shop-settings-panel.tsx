import Box from '@mui/material/Box';
import Button from '@mui/material/Button';
import Paper from '@mui/material/Paper';
import Typography from '@mui/material/Typography';
import { zodResolver } from '@hookform/resolvers/zod';
import {
  LOGO_MAX_BYTES,
  LOGO_SIZE_MESSAGE,
  LOGO_TYPES,
  shopNameSchema,
  shopTargetMarginSchema,
  type LogoType,
} from '@quietglass/shared';
import { useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { ConflictAlert } from '../../../components/conflict-alert';
import { ErrorAlert } from '../../../components/error-alert';
import { FormTextField } from '../../../components/form-text-field';
import { ApiError, apiUrl } from '../../../lib/api-client';
import { notify } from '../../../lib/notifier';
import { typedNumber } from '../../../lib/validation';
import { useShopSettings } from '../api/get-shop-settings';
import { useSaveShopSettings } from '../api/save-shop-settings';

/** The name form: the API's own rule (trimmed, required, limited). */
const nameFormSchema = shopNameSchema.pick({ shopName: true });

/** The margin form: the typed text parsed, then the API's own limits and message. */
const marginFormSchema = z.object({
  targetMarginPercent: typedNumber.pipe(shopTargetMarginSchema.shape.targetMarginPercent),
});

/** Why a chosen logo file cannot be uploaded, before it is sent; null when it can. */
export function logoFileError(file: { type: string; size: number }): string | null {
  if (!(LOGO_TYPES as readonly string[]).includes(file.type)) return 'The logo must be a PNG or JPEG image';
  if (file.size > LOGO_MAX_BYTES) return LOGO_SIZE_MESSAGE;
  return null;
}

function base64Of(file: Blob): Promise<string> {
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () =>
      resolve(typeof reader.result === 'string' ? reader.result.replace(/^data:[^,]*,/, '') : '');
    reader.onerror = () => reject(reader.error ?? new Error('The file could not be read'));
    reader.readAsDataURL(file);
  });
}

/** The shop's name and logo, printed in the header of run sheets and compliance reports (admins). */
export function ShopSettingsPanel() {
  const settings = useShopSettings();
  const save = useSaveShopSettings();
  const [fileError, setFileError] = useState<string | null>(null);
  const fileInput = useRef<HTMLInputElement | null>(null);
  const { control, handleSubmit, reset } = useForm<{ shopName: string }>({
    defaultValues: { shopName: '' },
    resolver: zodResolver(nameFormSchema),
    mode: 'onTouched',
  });
  const margin = useForm<{ targetMarginPercent: string }, unknown, z.output<typeof marginFormSchema>>({
    defaultValues: { targetMarginPercent: '' },
    resolver: zodResolver(marginFormSchema),
    mode: 'onTouched',
  });
  const view = settings.data;
  useEffect(() => {
    if (view) reset({ shopName: view.shopName });
  }, [view?.version, view?.shopName, reset]); // eslint-disable-line react-hooks/exhaustive-deps
  const resetMargin = margin.reset;
  useEffect(() => {
    if (view) resetMargin({ targetMarginPercent: String(view.targetMarginPercent) });
  }, [view?.version, view?.targetMarginPercent, resetMargin]); // eslint-disable-line react-hooks/exhaustive-deps
  const conflict = save.error instanceof ApiError && save.error.status === 409 ? save.error : null;

  const onSubmit = handleSubmit(({ shopName }) => {
    if (!view) return;
    save.mutate(
      { kind: 'name', shopName, version: view.version },
      { onSuccess: () => notify('Shop name saved.', 'success') },
    );
  });
  const onSaveMargin = margin.handleSubmit(({ targetMarginPercent }) => {
    if (!view) return;
    save.mutate(
      {
        kind: 'target-margin',
        targetMarginPercent,
        version: view.version,
      },
      { onSuccess: () => notify('Default target margin saved.', 'success') },
    );
  });
  const onFile = async (file: File | undefined) => {
    if (!file || !view) return;
    const problem = logoFileError(file);
    setFileError(problem);
    if (problem) return;
    const dataBase64 = await base64Of(file);
    save.mutate(
      { kind: 'logo', contentType: file.type as LogoType, dataBase64, version: view.version },
      { onSuccess: () => notify('Logo uploaded.', 'success') },
    );
  };

  return (
    <Paper variant="outlined" sx={{ p: 2, mb: 2 }} component="section" aria-label="Shop settings">
      <Typography variant="h2" component="h2" gutterBottom>
        Shop settings
      </Typography>
      <Typography variant="body2" color="text.secondary" sx={{ mb: 1.5 }}>
        The name and logo in the header of run sheets and compliance reports (PNG or JPEG, at most{' '}
        {LOGO_MAX_BYTES / 1024} KB and 4000 px a side), and the margin optimisations design in.
      </Typography>
      {settings.isError && (
        <ErrorAlert error={settings.error} title="The shop settings could not be loaded" />
      )}
      {conflict && (
        <ConflictAlert
          message={conflict.message}
          onReload={() => {
            save.reset();
            void settings.refetch();
          }}
        />
      )}
      {save.error && !conflict && <ErrorAlert error={save.error} title="Not saved" />}
      {view && (
        <Box
          sx={{
            display: 'grid',
            gap: 2,
            gridTemplateColumns: { xs: '1fr', md: '2fr 1fr' },
            alignItems: 'start',
          }}
        >
          <Box
            component="form"
            noValidate
            onSubmit={(e) => void onSubmit(e)}
            sx={{ display: 'flex', gap: 1 }}
          >
            <FormTextField
              control={control}
              name="shopName"
              label="Shop name"
              size="small"
              sx={{ flexGrow: 1 }}
            />
            <Button type="submit" variant="contained" loading={save.isPending}>
              Save name
            </Button>
          </Box>
          <Box sx={{ display: 'flex', gap: 1, alignItems: 'center', flexWrap: 'wrap' }}>
            {view.logo ? (
              <Box
                component="img"
                src={`${apiUrl('/shop-settings/logo')}?v=${view.version}`}
                alt="Shop logo"
                sx={{ maxHeight: 40, maxWidth: 140, objectFit: 'contain', border: 1, borderColor: 'divider' }}
              />
            ) : (
              <Typography variant="body2" color="text.secondary">
                No logo
              </Typography>
            )}
            <Button variant="outlined" onClick={() => fileInput.current?.click()}>
              {view.logo ? 'Replace logo…' : 'Upload logo…'}
            </Button>
            <input
              ref={fileInput}
              type="file"
              accept={LOGO_TYPES.join(',')}
              aria-label="Logo file"
              hidden
              onChange={(e) => {
                void onFile(e.target.files?.[0]);
                e.target.value = '';
              }}
            />
            {view.logo && (
              <Button
                color="error"
                onClick={() =>
                  save.mutate(
                    { kind: 'remove-logo', version: view.version },
                    { onSuccess: () => notify('Logo removed.', 'success') },
                  )
                }
              >
                Remove logo
              </Button>
            )}
            {fileError && (
              <Typography role="alert" variant="body2" color="error" sx={{ width: '100%' }}>
                {fileError}
              </Typography>
            )}
          </Box>
          <Box
            component="form"
            noValidate
            aria-label="Design defaults"
            onSubmit={(e) => void onSaveMargin(e)}
            sx={{ display: 'flex', gap: 1, alignItems: 'flex-start', gridColumn: '1 / -1' }}
          >
            <FormTextField
              control={margin.control}
              name="targetMarginPercent"
              label="Default target margin (pp)"
              size="small"
              sx={{ width: 220 }}
              helperText="Fit to mask and Grow layers design this far inside every limit unless the engineer asks for another"
            />
            <Button type="submit" variant="contained" loading={save.isPending}>
              Save margin
            </Button>
          </Box>
        </Box>
      )}
    </Paper>
  );
}
