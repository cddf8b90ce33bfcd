/**
 * Module boundaries of the server (see the comment in eslint.config.js):
 * - `public-only`: a file in modules/<a>/ imports from modules/<b>/ only b's public files;
 * - `no-folder-cycle`: no import makes a loop between server folders (modules/<x>, db, lib, http, …),
 *   which import-x/no-cycle misses when the files themselves form no loop.
 * Plain Node with no dependencies: the folder graph is read from the source once per lint run.
 */
import fs from 'node:fs';
import path from 'node:path';

const importPattern = /(?:^|[\s;])(?:import|export)\s(?:[^'";]*?\sfrom\s*)?['"](\.{1,2}\/[^'"]+)['"]|import\(\s*['"](\.{1,2}\/[^'"]+)['"]\s*\)/g;

function resolveImport(fromFile, specifier) {
  const base = path.resolve(path.dirname(fromFile), specifier);
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, path.join(base, 'index.ts')]) {
    if (fs.existsSync(candidate) && fs.statSync(candidate).isFile()) return candidate;
  }
  return `${base}.ts`;
}

/** The folder a file belongs to: `modules/<name>` inside modules, else its top folder under src (`.` for app.ts). */
function folderOf(srcDir, file) {
  const relative = path.relative(srcDir, file);
  if (relative.startsWith('..')) return null;
  const parts = relative.split(path.sep);
  if (parts[0] === 'modules' && parts.length > 2) return `modules/${parts[1]}`;
  return parts.length > 1 ? parts[0] : '.';
}

function listFiles(dir) {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return listFiles(full);
    return /\.tsx?$/.test(entry.name) ? [full] : [];
  });
}

const graphs = new Map();

/** Folder → folders it imports, from every file under src (built once per lint run). */
function folderGraph(srcDir) {
  const cached = graphs.get(srcDir);
  if (cached) return cached;
  const graph = new Map();
  for (const file of listFiles(srcDir)) {
    const from = folderOf(srcDir, file);
    const text = fs.readFileSync(file, 'utf8');
    for (const match of text.matchAll(importPattern)) {
      const to = folderOf(srcDir, resolveImport(file, match[1] ?? match[2]));
      if (!to || to === from) continue;
      if (!graph.has(from)) graph.set(from, new Set());
      graph.get(from).add(to);
    }
  }
  graphs.set(srcDir, graph);
  return graph;
}

/** A path of folders from `start` back to `goal`, or null. */
function pathBetween(graph, start, goal) {
  const previous = new Map([[start, null]]);
  const queue = [start];
  while (queue.length > 0) {
    const node = queue.shift();
    if (node === goal) {
      const route = [];
      for (let at = node; at !== null; at = previous.get(at)) route.unshift(at);
      return route;
    }
    for (const next of graph.get(node) ?? []) {
      if (!previous.has(next)) {
        previous.set(next, node);
        queue.push(next);
      }
    }
  }
  return null;
}

function globToRegExp(glob) {
  return new RegExp(`^${glob.replace(/[.+^${}()|[\]\\]/g, '\\$&').replace(/\*/g, '[^/]*')}$`);
}

function sourcesOf(node) {
  if (node.type === 'ImportExpression') return node.source.type === 'Literal' ? node.source : null;
  return node.source ?? null;
}

function visitImports(check) {
  const visit = (node) => {
    const source = sourcesOf(node);
    if (source && typeof source.value === 'string' && source.value.startsWith('.')) check(node, source.value);
  };
  return { ImportDeclaration: visit, ExportNamedDeclaration: visit, ExportAllDeclaration: visit, ImportExpression: visit };
}

const publicOnly = {
  meta: {
    type: 'problem',
    docs: { description: "A server module imports another module's public files only" },
    schema: [
      {
        type: 'object',
        properties: {
          srcDir: { type: 'string' },
          publicFiles: { type: 'array', items: { type: 'string' } },
          modelsMayReferenceModels: { type: 'boolean' },
        },
        additionalProperties: false,
      },
    ],
    messages: {
      private: "'{{target}}' is private to the {{module}} module. Reach it through its public files ({{convention}}).",
    },
  },
  create(context) {
    const { srcDir, publicFiles = [], modelsMayReferenceModels = false } = context.options[0] ?? {};
    const root = path.resolve(srcDir);
    const file = context.filename;
    const from = folderOf(root, file);
    if (!from?.startsWith('modules/')) return {};
    const patterns = publicFiles.map(globToRegExp);
    return visitImports((node, specifier) => {
      const target = resolveImport(file, specifier);
      const to = folderOf(root, target);
      if (!to?.startsWith('modules/') || to === from) return;
      const inModule = path.relative(path.join(root, to), target).split(path.sep).join('/');
      const name = `${to.slice('modules/'.length)}/${inModule}`;
      if (patterns.some((pattern) => pattern.test(inModule) || pattern.test(name))) return;
      if (modelsMayReferenceModels && file.endsWith('.model.ts') && inModule.endsWith('.model.ts')) return;
      context.report({ node, messageId: 'private', data: { target: name, module: to.slice('modules/'.length), convention: publicFiles.join(', ') } });
    });
  },
};

const noFolderCycle = {
  meta: {
    type: 'problem',
    docs: { description: 'No import loop between server folders (modules/<name>, db, lib, http, …)' },
    schema: [{ type: 'object', properties: { srcDir: { type: 'string' } }, additionalProperties: false }],
    messages: { cycle: 'This import makes a loop between server folders: {{route}}' },
  },
  create(context) {
    const root = path.resolve(context.options[0]?.srcDir ?? '.');
    const file = context.filename;
    const from = folderOf(root, file);
    if (!from) return {};
    return visitImports((node, specifier) => {
      const to = folderOf(root, resolveImport(file, specifier));
      if (!to || to === from) return;
      const back = pathBetween(folderGraph(root), to, from);
      if (back) context.report({ node, messageId: 'cycle', data: { route: [from, ...back].join(' → ') } });
    });
  },
};

export default { meta: { name: 'burrowline-server-modules' }, rules: { 'public-only': publicOnly, 'no-folder-cycle': noFolderCycle } };
