import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { defineConfig, type Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import { compression } from 'vite-plugin-compression2';
import { pwaPlugin } from './pwa.config';

const apiPort = process.env.API_PORT ?? '3001';
const port = Number(process.env.PORT ?? 3000);

// React Router's package exports name only its development build (warnings, invariant texts); a production
// build takes the production files the package ships beside it.
const reactRouterProduction = join(dirname(createRequire(import.meta.url).resolve('react-router/package.json')), 'dist', 'production');

// That build makes its components and contexts with unmarked React calls and names them afterwards, so the
// bundler keeps every one (forms, fetchers, server components) whether the app uses it or not. Marked pure and
// left unnamed, only the router parts the app renders stay in the chunk every page loads. Its links can also
// prefetch a framework app's route modules; this app has none and never asks (outside a framework the link
// gets no prefetch handlers and no prefetch ref), so that code goes too.
const LINK_WITHOUT_PREFETCH: [string, string][] = [
  [
    `let [shouldPrefetch, prefetchRef, prefetchHandlers] = usePrefetchBehavior(
      prefetch,
      rest
    );`,
    'let prefetchRef = null, prefetchHandlers = {};',
  ],
  [
    'return shouldPrefetch && !isAbsolute ? /* @__PURE__ */ React10.createElement(React10.Fragment, null, link, /* @__PURE__ */ React10.createElement(PrefetchPageLinks, { page: href })) : link;',
    'return link;',
  ],
];

function reactRouterTreeShaking(): Plugin {
  return {
    name: 'hitchbook:react-router-tree-shaking',
    apply: 'build',
    transform(code, id) {
      if (!id.startsWith(reactRouterProduction)) return null;
      let shaken = code
        .replace(/= (React\d*)\.(forwardRef|createContext|memo)\(/g, '= /* @__PURE__ */ $1.$2(')
        .replace(/^\w+\.displayName = "[^"]*";$/gm, '');
      if (shaken.includes('var Link = ')) {
        for (const [from, to] of LINK_WITHOUT_PREFETCH) {
          if (!shaken.includes(from)) this.warn("React Router's Link changed: its prefetch code stays in the bundle.");
          shaken = shaken.replace(from, to);
        }
      }
      return { code: shaken, map: null };
    },
  };
}

// Brotli and gzip copies of every text file, written once at build for the API to send to browsers that accept
// them (app.factory.ts): compressing per request would cost the server each time, and nothing at all here.
const precompressed = compression({
  algorithms: ['brotliCompress', 'gzip'],
  include: /\.(js|css|html|svg|json|webmanifest)$/,
  threshold: 1024,
});

export default defineConfig(({ mode }) => ({
  plugins: [react(), pwaPlugin(), reactRouterTreeShaking(), precompressed],
  resolve: {
    alias:
      mode === 'production'
        ? [
            { find: /^react-router$/, replacement: join(reactRouterProduction, 'index.mjs') },
            { find: /^react-router\/dom$/, replacement: join(reactRouterProduction, 'dom-export.mjs') },
          ]
        : [],
  },
  server: {
    host: '127.0.0.1',
    port,
    strictPort: true,
    proxy: { '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false } },
  },
  preview: { host: '127.0.0.1', port },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    sourcemap: true,
    // Mantine and React make a large but cacheable entry chunk; route chunks stay small.
    chunkSizeWarningLimit: 900,
    rolldownOptions: {
      output: {
        // Mantine's own core (provider, factories, styles API) is under every component, and the inputs, text
        // and buttons are on the sign-in page and nearly every other; TanStack Query is under every signed-in
        // page. Left to the splitter each scatters over many small chunks that compress worse than one.
        codeSplitting: {
          groups: [
            { name: 'mantine-core', test: /@mantine[\\/]core[\\/]esm[\\/](core(?![\\/](utils[\\/](create-scoped-keydown-handler|close-on-escape|find-element-ancestor|get-context-item-index|use-hovered|get-default-z-index)|MantineProvider[\\/]use-mantine-color-scheme)[\\/])|components[\\/](Input|InputBase|TextInput|Anchor|UnstyledButton|Loader|Transition|CloseButton|Alert|Text|Button|Stack|Title|Group|Paper|Center|Container))[\\/]|@tabler[\\/]icons-react[\\/]dist[\\/]esm[\\/](createReactComponent|defaultAttributes)\.mjs$|src[\\/](components[\\/](FormErrorAlert|DatabaseDownNotice)|lib[\\/]serverIssues|theme|app[\\/](ErrorBoundary|layout[\\/]BrandLockup))\.tsx?$/ },
            // What the cab form needs to draw itself, beyond React and Mantine's core: one chunk compresses better
            // than the dozen small ones the splitter would make of it. The office frame loads it too (it shares the
            // queue's sync, the page header and the areas map), so it is a chunk of the signed-in app.
            {
              name: 'cab-form',
              // Only the modules named: React, Mantine's core and the app's shared code stay where the sign-in page gets them.
              includeDependenciesRecursively: false,
              test: /src[\\/](features[\\/]work[\\/](components[\\/](LogWorkPanel|NewEntryForm|EntryFields|EntryActions)|useEntryForm|entryForm|quantity|pickers|lastUsed|clientId|loadEntryOptions|entrySchema|api[\\/](listMachineOptions|listFieldOptions|listWorkTypes|listBillToParties|listMembers|lastMeterReading))|features[\\/]offline[\\/](phoneQueue|photoBudget|networkMode|components[\\/]PhoneQueueSync)|lib[\\/](useLoaded|lazySchema|localTime|afterFirstPaint|areas)|components[\\/](FormGrid|PageHeader|DecimalInput))\.tsx?$|@mantine[\\/]core[\\/]esm[\\/]components[\\/](NativeSelect[\\/]|Combobox[\\/](ComboboxChevron[\\/]|Combobox\.module\.css|get-parsed-combobox-data[\\/]))|@tabler[\\/]icons-react[\\/]dist[\\/]esm[\\/]icons[\\/]Icon(List|Plus|Send|DeviceFloppy)\.mjs$/,
            },
            { name: 'query', test: /@tanstack[\\/](query-core|react-query)[\\/]/ },
          ],
        },
      },
    },
  },
}));
