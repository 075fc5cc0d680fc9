import { createTheme } from '@mui/material/styles';
import type {} from '@mui/x-data-grid/themeAugmentation';

/** Quietglass palette: deep teal ink, pale glass greys, a warm copper accent. */
const ink = '#12343b';
const teal = '#1f6b70';
const copper = '#b8622d';
const glass = '#f2f6f6';

export const theme = createTheme({
  palette: {
    mode: 'light',
    primary: { main: teal, dark: ink, light: '#5c9ea0', contrastText: '#ffffff' },
    secondary: { main: copper, dark: '#8f4619', light: '#d98a4e', contrastText: '#ffffff' },
    background: { default: glass, paper: '#ffffff' },
    text: { primary: '#152a2f', secondary: '#4a6268' },
    divider: 'rgba(18, 52, 59, 0.12)',
    success: { main: '#2e7d5b' },
    warning: { main: '#a86a12' },
    error: { main: '#b3353b' },
    info: { main: '#2f6690' },
  },
  shape: { borderRadius: 8 },
  typography: {
    fontFamily: '"IBM Plex Sans", system-ui, -apple-system, "Segoe UI", sans-serif',
    h1: { fontSize: '1.75rem', fontWeight: 600 },
    h2: { fontSize: '1.375rem', fontWeight: 600 },
    h3: { fontSize: '1.125rem', fontWeight: 600 },
    button: { textTransform: 'none', fontWeight: 500 },
  },
  components: {
    MuiAppBar: {
      defaultProps: { elevation: 0 },
      styleOverrides: { root: { backgroundColor: ink } },
    },
    MuiCard: {
      defaultProps: { variant: 'outlined' },
    },
    MuiPaper: {
      styleOverrides: { outlined: { borderColor: 'rgba(18, 52, 59, 0.14)' } },
    },
    MuiDataGrid: {
      styleOverrides: { root: { backgroundColor: '#ffffff' } },
    },
  },
});
