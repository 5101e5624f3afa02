/**
 * The pane follows the host's theme (taskpane/theme.ts). Luminance is WCAG 2.1's relative luminance: checked
 * against the contrast ratios WCAG's understanding documents print for grey on white (#767676 is the lightest
 * grey with 4.5:1 on white: 4.54:1 [printed, WCAG 2.1 Understanding SC 1.4.3]) and the two ends of the scale.
 */
import { luminance, themeOf } from '../../../taskpane/theme';

const contrastOnWhite = (hex: string): number => 1.05 / (luminance(hex)! + 0.05);

test('relative luminance: black 0, white 1, #767676 at 4.54:1 on white', () => {
  expect(luminance('#000000')).toBe(0);
  expect(luminance('#ffffff')).toBe(1);
  expect(luminance('#fff')).toBe(1);
  expect(Number(contrastOnWhite('#767676').toFixed(2))).toBe(4.54);
  expect(luminance('not a colour')).toBeNull();
});

test('a dark body background means the dark theme; a light one, none or an unreadable one the light theme', () => {
  expect(themeOf({ bodyBackgroundColor: '#262626' })).toBe('dark');
  expect(themeOf({ bodyBackgroundColor: '#444444' })).toBe('dark');
  expect(themeOf({ bodyBackgroundColor: '#FFFFFF' })).toBe('light');
  expect(themeOf({ bodyBackgroundColor: '#e6e6e6' })).toBe('light');
  expect(themeOf({ bodyBackgroundColor: 'rgb(0,0,0)' })).toBe('light');
  expect(themeOf(null)).toBe('light');
});

test('the host\u2019s own word wins over its colours', () => {
  expect(themeOf({ isDarkTheme: true, bodyBackgroundColor: '#ffffff' })).toBe('dark');
  expect(themeOf({ isDarkTheme: false, bodyBackgroundColor: '#000000' })).toBe('light');
});
