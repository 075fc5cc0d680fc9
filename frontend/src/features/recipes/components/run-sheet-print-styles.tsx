import GlobalStyles from '@mui/material/GlobalStyles';

/**
 * Print rules of the run sheet page: the app's top bar and navigation, the page's buttons and
 * anything marked `data-print="hide"` (the chamber and wavelength choices) stay off paper.
 * Rendered only by that page, so other pages print as they are.
 */
export function RunSheetPrintStyles() {
  return (
    <GlobalStyles
      styles={{
        '@media print': {
          '.MuiAppBar-root, .MuiDrawer-root, .MuiDrawer-docked, nav[aria-label="Main"], [data-print="hide"], .MuiSnackbar-root, main .MuiButton-root':
            { display: 'none !important' },
          // The spacer under the fixed top bar.
          'main > .MuiToolbar-root': { display: 'none !important' },
          main: { padding: '0 !important' },
          body: { background: '#fff' },
          // Landscape like the PDF: the layer table has columns to write the actual values in.
          '@page': { size: 'A4 landscape', margin: '10mm' },
          '.js-plotly-plot .modebar': { display: 'none !important' },
        },
      }}
    />
  );
}
