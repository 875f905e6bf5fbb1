import { themeQuartz } from 'ag-grid-community';

/**
 * Ringlet's grid look, built with AG Grid's Theming API: our ink blue and teal, Noto Sans (shipped
 * with the app; the grid's Google-fonts loader stays off), compact rows for tabular reading.
 */
export const ringletGridTheme = themeQuartz.withParams({
  fontFamily: ['Noto Sans', 'sans-serif'],
  fontSize: 13,
  headerFontWeight: 600,
  foregroundColor: '#1b2430',
  headerTextColor: '#1f3a5f',
  headerBackgroundColor: '#eef2f7',
  accentColor: '#1b7f79',
  borderColor: '#d5dbe3',
  rowHoverColor: '#f1f6f6',
  selectedRowBackgroundColor: '#dcefed',
  oddRowBackgroundColor: '#fafbfc',
  spacing: 6,
  rowHeight: 34,
  headerHeight: 36,
  wrapperBorderRadius: 6,
  focusShadow: { radius: 2, spread: 0, color: '#1b7f79' },
});
