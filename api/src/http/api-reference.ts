/** A readable API reference page rendered on the server from the OpenAPI document (no scripts). */
interface Doc {
  info: { title: string; version: string; description?: string };
  paths: Record<
    string,
    Record<
      string,
      {
        summary?: string;
        description?: string;
        tags?: string[];
        requestBody?: unknown;
        parameters?: unknown[];
        responses?: Record<string, unknown>;
      }
    >
  >;
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

export function renderApiReference(doc: Doc): string {
  const byTag = new Map<string, string[]>();
  for (const [path, ops] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(ops)) {
      const tag = op.tags?.[0] ?? 'other';
      const body = op.requestBody
        ? `<details><summary>Request body</summary><pre>${esc(JSON.stringify(op.requestBody, null, 2))}</pre></details>`
        : '';
      const params = op.parameters?.length
        ? `<details><summary>Parameters</summary><pre>${esc(JSON.stringify(op.parameters, null, 2))}</pre></details>`
        : '';
      const responses = `<details><summary>Responses: ${Object.keys(op.responses ?? {}).join(', ')}</summary><pre>${esc(JSON.stringify(op.responses, null, 2))}</pre></details>`;
      const html = `<section class="op" id="${esc(method + path)}"><h3><span class="m m-${method}">${method.toUpperCase()}</span> <code>${esc(path)}</code></h3><p>${esc(op.summary ?? '')}</p><p class="d">${esc(op.description ?? '').replace(/\n\n/g, '<br>')}</p>${params}${body}${responses}</section>`;
      byTag.set(tag, [...(byTag.get(tag) ?? []), html]);
    }
  }
  const toc = [...byTag.keys()].map((t) => `<a href="#tag-${esc(t)}">${esc(t)}</a>`).join(' · ');
  const sections = [...byTag.entries()]
    .map(([t, ops]) => `<h2 id="tag-${esc(t)}">${esc(t)}</h2>${ops.join('')}`)
    .join('');
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(doc.info.title)} reference</title><meta name="viewport" content="width=device-width, initial-scale=1"><link rel="stylesheet" href="/api/docs.css"></head><body><header><h1>${esc(doc.info.title)} <small>${esc(doc.info.version)}</small></h1><p>${esc(doc.info.description ?? '')}</p><p>Machine-readable: <a href="/api/v1/openapi.json">/api/v1/openapi.json</a></p><nav>${toc}</nav></header><main>${sections}</main></body></html>`;
}

export const API_REFERENCE_CSS = `body{font-family:"Noto Sans",system-ui,sans-serif;margin:0;color:#1a1c1e;background:#f7f8fa}header{background:#1f3a5f;color:#fff;padding:16px 24px}header a{color:#bfe6e3}main{padding:8px 24px;max-width:1100px}h2{color:#1f3a5f;border-bottom:2px solid #1b7f79;padding-top:12px}.op{background:#fff;border:1px solid #d8dde3;border-radius:6px;padding:8px 16px;margin:10px 0}.op h3{margin:4px 0;font-size:1rem}.m{display:inline-block;min-width:64px;text-align:center;border-radius:4px;color:#fff;font-size:.8rem;padding:2px 6px;background:#1f3a5f}.m-post{background:#1b7f79}.m-put,.m-patch{background:#8a5a12}.m-delete{background:#a4262c}.d{color:#44474e;font-size:.9rem}pre{background:#f1f3f5;padding:8px;overflow:auto;font-size:.8rem}`;
