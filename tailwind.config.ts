// Afterwatch design tokens. Loaded by src/styles/index.css through Tailwind v4's `@config`,
// so every token below is a utility class (`bg-canvas`, `text-state-safe`, `font-mono` ...).
//
// Intent: a calm dark surface that reads from across a depot office on a wall screen.
// Body text is near-white on near-black (contrast well above 12:1); each unit state has its
// own hue, chosen to stay distinguishable for the common red-green deficiencies when paired
// with its glyph (the badge never relies on colour alone: label + shape + colour).
import type { Config } from 'tailwindcss';

export default {
  theme: {
    extend: {
      colors: {
        canvas: '#10151c', // page background
        panel: '#161d26', // cards, table body
        raised: '#1e2732', // headers, inputs, hovered rows
        line: '#2b3643', // borders and rules
        fg: '#e9eef3', // primary text
        muted: '#9eabb8', // secondary text (about 7:1 on canvas)
        accent: '#8fc7ff', // links, focus rings, primary buttons
        danger: '#ff7a70', // destructive actions and error text
        caution: '#f2b84b', // caution notes
        state: {
          keyon: '#7fc0ff', // key on: blue, solid disc
          purging: '#f2b84b', // purge in progress: amber, hourglass
          safe: '#52d68f', // safe to isolate: green, check in a ring
          isolated: '#c3ccd6', // isolated: light grey, hollow square
          interrupted: '#ff7a70', // purge interrupted: red, warning triangle
          nocontact: '#c7a2ff', // no contact: violet, broken ring
          nodata: '#7d8896', // no data yet: dim grey, dash
        },
      },
      fontFamily: {
        sans: ['Inter', 'system-ui', 'sans-serif'],
        mono: ['"Roboto Mono"', 'ui-monospace', 'monospace'],
      },
    },
  },
} satisfies Config;
