/**
 * The font stacks the map style names in `text-font`. Each has SDF glyph files under tiles/glyphs/,
 * rendered from @fontsource/inter (SIL Open Font License) by region:generate --glyphs.
 */
export const MAP_FONTS = [
  { stack: 'Inter Regular', weight: 400, style: 'normal' },
  { stack: 'Inter SemiBold', weight: 600, style: 'normal' },
  { stack: 'Inter Italic', weight: 400, style: 'italic' },
] as const;

export type MapFontStack = (typeof MAP_FONTS)[number]['stack'];
