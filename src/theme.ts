/**
 * Deckshare's look: a calm slate-teal scheme with warm neutral surfaces, set through
 * ant-design's theme tokens so every component follows it.
 */
import type { ThemeConfig } from 'ant-design-vue/es/config-provider/context';

export const FONT_STACK =
  "'Open Sans', system-ui, -apple-system, 'Segoe UI', Roboto, 'Helvetica Neue', Arial, sans-serif";

export const palette = {
  primary: '#2f6b73',
  primaryDark: '#1e434a',
  header: '#1f3d44',
  headerText: '#e9f1ef',
  headerMuted: '#a9c4bf',
  surface: '#ffffff',
  page: '#f3f4f1',
  border: '#d9ddd6',
  text: '#1f2a2c',
  muted: '#5d6b6d',
  success: '#3f7f4f',
  warning: '#b7791f',
  error: '#b23b3b',
  info: '#3a6f9a',
} as const;

export const theme: ThemeConfig = {
  token: {
    colorPrimary: palette.primary,
    colorInfo: palette.info,
    colorSuccess: palette.success,
    colorWarning: palette.warning,
    colorError: palette.error,
    colorInfoBg: '#eef4f8',
    colorInfoBorder: '#c6d8e6',
    colorSuccessBg: '#eef6ef',
    colorSuccessBorder: '#c3dec8',
    colorWarningBg: '#fbf4e6',
    colorWarningBorder: '#ecd3a4',
    colorErrorBg: '#fbefee',
    colorErrorBorder: '#ecc4c2',
    colorLink: palette.primary,
    colorTextBase: palette.text,
    colorBgLayout: palette.page,
    colorBorder: palette.border,
    colorBorderSecondary: '#e6e9e3',
    fontFamily: FONT_STACK,
    fontSize: 14,
    borderRadius: 6,
    wireframe: false,
  },
  components: {
    Layout: {
      colorBgHeader: palette.header,
      colorBgBody: palette.page,
    },
    Table: {
      colorFillAlter: '#f6f7f4',
    },
  },
};
