// For the tests only (client-namespaces.test.ts): which catalogue namespaces the client components
// under a page or layout read, found by reading the source with TypeScript's own parser.
//
// A page hands its client components only those namespaces (src/i18n/client-messages.tsx): the
// whole catalogue is about 86 kB of every page's HTML, serialised and escaped on every request.
import { existsSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import ts from "typescript";

export const ROOT = path.resolve(import.meta.dirname, "../..");

/**
 * Functions a root translator (`useTranslations()`) is handed to, and the namespaces they read
 * with it. A root translator passed to any other function is reported, so that this list is
 * kept true.
 */
export const TRANSLATOR_TAKERS: Record<string, { namespaces: readonly string[]; files: readonly string[] }> = {
  quantityText: { namespaces: ["lot"], files: ["src/lib/amount.ts"] },
  unreadNumbers: { namespaces: ["validation"], files: ["src/lib/floor-form-check.ts"] },
  checkOffline: { namespaces: ["validation"], files: ["src/lib/floor-form-check.ts", "src/lib/validation/field-errors.ts"] },
};

type FileFacts = { client: boolean; imports: string[]; namespaces: Set<string>; problems: string[] };
const facts = new Map<string, FileFacts>();

function resolveImport(from: string, spec: string): string | null {
  let base: string;
  if (spec.startsWith("@/")) base = path.join(ROOT, "src", spec.slice(2));
  else if (spec.startsWith(".")) base = path.resolve(path.dirname(from), spec);
  else return null;
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, path.join(base, "index.ts"), path.join(base, "index.tsx")]) {
    if (/\.tsx?$/.test(candidate) && existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  return null;
}

/**
 * The namespace a key written for a root translator reads: its first segment, or in a template
 * key the first segment before `${…}`. Null when that is not written out.
 */
function namespacesOfKey(node: ts.Expression): string[] | null {
  if (ts.isStringLiteral(node) || ts.isNoSubstitutionTemplateLiteral(node)) return [topOf(node.text)];
  if (ts.isTemplateExpression(node)) return node.head.text.includes(".") ? [topOf(node.head.text)] : null;
  if (ts.isConditionalExpression(node)) {
    const a = namespacesOfKey(node.whenTrue);
    const b = namespacesOfKey(node.whenFalse);
    return a && b ? [...a, ...b] : null;
  }
  if (ts.isParenthesizedExpression(node)) return namespacesOfKey(node.expression);
  return null;
}

const unwrap = (node: ts.Expression): ts.Expression =>
  ts.isAsExpression(node) || ts.isParenthesizedExpression(node) || ts.isNonNullExpression(node) ? unwrap(node.expression) : node;

const topOf = (namespace: string) => namespace.split(".")[0]!;

const isCallOf = (node: ts.Node, name: string): node is ts.CallExpression =>
  ts.isCallExpression(node) && ts.isIdentifier(node.expression) && node.expression.text === name;

function readFacts(file: string): FileFacts {
  const known = facts.get(file);
  if (known) return known;
  const source = ts.createSourceFile(file, readFileSync(file, "utf8"), ts.ScriptTarget.Latest, true, file.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const first = source.statements[0];
  const client = !!first && ts.isExpressionStatement(first) && ts.isStringLiteral(first.expression) && first.expression.text === "use client";
  const imports: string[] = [];
  const namespaces = new Set<string>();
  const problems: string[] = [];
  const where = (node: ts.Node) => `${path.relative(ROOT, file)}:${source.getLineAndCharacterOfPosition(node.getStart()).line + 1}`;
  // Root translators (`const t = useTranslations()`) by their declaration: their keys say which namespaces they read.
  const rootTranslators = new Set<ts.Declaration>();

  const visit = (node: ts.Node) => {
    if (ts.isImportDeclaration(node) && !node.importClause?.isTypeOnly && ts.isStringLiteral(node.moduleSpecifier)) {
      const target = resolveImport(file, node.moduleSpecifier.text);
      if (target) imports.push(target);
    } else if (ts.isExportDeclaration(node) && !node.isTypeOnly && node.moduleSpecifier && ts.isStringLiteral(node.moduleSpecifier)) {
      const target = resolveImport(file, node.moduleSpecifier.text);
      if (target) imports.push(target);
    } else if (ts.isCallExpression(node) && node.expression.kind === ts.SyntaxKind.ImportKeyword && node.arguments[0] && ts.isStringLiteral(node.arguments[0])) {
      const target = resolveImport(file, node.arguments[0].text);
      if (target) imports.push(target);
    } else if (isCallOf(node, "useTranslations")) {
      const [arg] = node.arguments;
      const namespace = !arg ? "" : ts.isStringLiteral(arg) || ts.isNoSubstitutionTemplateLiteral(arg) ? arg.text : null;
      const declaration = findDeclaration(node);
      // A namespaced translator reads within its namespace, whatever its keys.
      if (namespace === null) problems.push(`${where(node)}: useTranslations with a namespace not written out`);
      else if (namespace) namespaces.add(topOf(namespace));
      else if (ts.isVariableDeclaration(declaration) && ts.isIdentifier(declaration.name)) rootTranslators.add(declaration);
      else problems.push(`${where(node)}: useTranslations() whose translator is not kept in a named constant`);
    } else if (isCallOf(node, "useMessages")) {
      problems.push(`${where(node)}: useMessages reads the whole catalogue`);
    }
    ts.forEachChild(node, visit);
  };
  visit(source);

  // Every use of a root translator: a call with a written key, or a hand-over to a
  // TRANSLATOR_TAKERS function; any other use is reported.
  if (rootTranslators.size) {
    const uses = (node: ts.Node) => {
      const declaration = ts.isIdentifier(node) ? declarationOf(node) : undefined;
      if (declaration && rootTranslators.has(declaration) && !(ts.isVariableDeclaration(node.parent) && node.parent.name === node)) {
        let use: ts.Node = node;
        while (ts.isAsExpression(use.parent) || ts.isParenthesizedExpression(use.parent) || ts.isNonNullExpression(use.parent)) use = use.parent;
        const parent = use.parent;
        const call = ts.isCallExpression(parent) && parent.expression === node ? parent
          : ts.isPropertyAccessExpression(parent) && parent.expression === node && ts.isCallExpression(parent.parent) && parent.parent.expression === parent ? parent.parent
          : null;
        const read = call?.arguments[0] ? namespacesOfKey(call.arguments[0]) : null;
        if (read) read.forEach((n) => namespaces.add(n));
        else if (ts.isCallExpression(parent) && parent.arguments.includes(use as ts.Expression) && ts.isIdentifier(parent.expression) && TRANSLATOR_TAKERS[parent.expression.text]) {
          TRANSLATOR_TAKERS[parent.expression.text]!.namespaces.forEach((n) => namespaces.add(n));
        } else problems.push(`${where(node)}: ${call ? "a root translator called with a key not written out" : "a root translator handed on where its keys cannot be read"}`);
      }
      ts.forEachChild(node, uses);
    };
    uses(source);
  }
  const found = { client, imports, namespaces, problems };
  facts.set(file, found);
  return found;
}

/** The variable declaration a `useTranslations()` call initialises, through `as …` and parentheses. */
function findDeclaration(call: ts.Node): ts.Node {
  let node: ts.Node = call;
  while (node.parent && (ts.isAsExpression(node.parent) || ts.isParenthesizedExpression(node.parent))) node = node.parent;
  return node.parent && ts.isVariableDeclaration(node.parent) && unwrap(node.parent.initializer!) === call ? node.parent : node;
}

/** The declaration an identifier names: the nearest enclosing variable or parameter of that name. */
function declarationOf(id: ts.Identifier): ts.Declaration | undefined {
  for (let scope: ts.Node | undefined = id.parent; scope; scope = scope.parent) {
    const found = declaredIn(scope).get(id.text);
    if (found) return found;
  }
  return undefined;
}

const scopes = new WeakMap<ts.Node, Map<string, ts.Declaration>>();
/** Names a block, a function (its parameters) or a file declares directly. */
function declaredIn(scope: ts.Node): Map<string, ts.Declaration> {
  const known = scopes.get(scope);
  if (known) return known;
  const names = new Map<string, ts.Declaration>();
  const bind = (name: ts.BindingName, declaration: ts.Declaration) => {
    if (ts.isIdentifier(name)) names.set(name.text, declaration);
    else for (const element of name.elements) if (!ts.isOmittedExpression(element)) bind(element.name, element);
  };
  if (ts.isFunctionLike(scope)) for (const p of scope.parameters) bind(p.name, p);
  const statements = ts.isBlock(scope) || ts.isSourceFile(scope) || ts.isModuleBlock(scope) ? scope.statements : ts.isCaseClause(scope) || ts.isDefaultClause(scope) ? scope.statements : null;
  for (const statement of statements ?? []) if (ts.isVariableStatement(statement)) for (const d of statement.declarationList.declarations) bind(d.name, d);
  if ((ts.isForStatement(scope) || ts.isForOfStatement(scope) || ts.isForInStatement(scope)) && scope.initializer && ts.isVariableDeclarationList(scope.initializer)) {
    for (const d of scope.initializer.declarations) bind(d.name, d);
  }
  if (ts.isCatchClause(scope) && scope.variableDeclaration) bind(scope.variableDeclaration.name, scope.variableDeclaration);
  scopes.set(scope, names);
  return names;
}

/**
 * The namespaces read by the client components a page or layout renders: from the file, through
 * server modules, to each `"use client"` module, and everything that module imports.
 */
export function clientNamespacesOf(entry: string): { namespaces: string[]; problems: string[] } {
  const namespaces = new Set<string>();
  const problems: string[] = [];
  const serverSeen = new Set<string>();
  const clientSeen = new Set<string>();
  const client = (file: string) => {
    if (clientSeen.has(file)) return;
    clientSeen.add(file);
    const f = readFacts(file);
    f.namespaces.forEach((n) => namespaces.add(n));
    problems.push(...f.problems);
    f.imports.forEach(client);
  };
  const server = (file: string) => {
    if (serverSeen.has(file)) return;
    serverSeen.add(file);
    const f = readFacts(file);
    if (f.client) return client(file);
    f.imports.forEach(server);
  };
  server(entry);
  return { namespaces: [...namespaces].sort(), problems: [...new Set(problems)] };
}

/**
 * The namespaces a page or layout hands its client components: the list in
 * `export default withClientMessages([…], Page)` or in `<ClientMessages namespaces={[…]}>`; null
 * when it names none (it then hands on what the layout above it hands).
 */
export function declaredNamespaces(file: string): string[] | null {
  const source = ts.createSourceFile(file, readFileSync(file, "utf8"), ts.ScriptTarget.Latest, true, ts.ScriptKind.TSX);
  const lists: string[][] = [];
  const literalList = (node: ts.Expression | undefined) => {
    if (!node || !ts.isArrayLiteralExpression(node)) throw new Error(`${path.relative(ROOT, file)}: the namespaces are not written as a list`);
    return node.elements.map((e) => {
      if (!ts.isStringLiteral(e)) throw new Error(`${path.relative(ROOT, file)}: a namespace not written out`);
      return e.text;
    });
  };
  const visit = (node: ts.Node) => {
    if (ts.isExportAssignment(node) && isCallOf(node.expression, "withClientMessages")) lists.push(literalList(node.expression.arguments[0]));
    if ((ts.isJsxOpeningElement(node) || ts.isJsxSelfClosingElement(node)) && ts.isIdentifier(node.tagName) && node.tagName.text === "ClientMessages") {
      const attribute = node.attributes.properties.find((p) => ts.isJsxAttribute(p) && p.name.getText() === "namespaces");
      const value = attribute && ts.isJsxAttribute(attribute) && attribute.initializer && ts.isJsxExpression(attribute.initializer) ? attribute.initializer.expression : undefined;
      lists.push(literalList(value));
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  if (lists.length > 1) throw new Error(`${path.relative(ROOT, file)}: more than one list of namespaces`);
  return lists[0] ?? null;
}
