import type { oas31 } from 'zod-openapi';

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

const escape = (text: string) =>
  text.replace(
    /[&<>"']/g,
    (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!,
  );

const json = (value: unknown) => `<pre>${escape(JSON.stringify(value, null, 2))}</pre>`;

function schemasOf(content: oas31.ContentObject | undefined): string {
  return Object.entries(content ?? {})
    .map(
      ([type, media]) => `<details><summary>${escape(type)}</summary>${json(media.schema ?? {})}</details>`,
    )
    .join('');
}

function operationHtml(path: string, method: string, op: oas31.OperationObject): string {
  const params = (op.parameters ?? []) as oas31.ParameterObject[];
  const body = op.requestBody as oas31.RequestBodyObject | undefined;
  const responses = Object.entries(op.responses ?? {}) as [string, oas31.ResponseObject][];
  return `<section id="${escape(`${method}-${path}`)}">
<h3><span class="m ${method}">${method.toUpperCase()}</span> <code>${escape(path)}</code></h3>
<p>${escape(op.summary ?? '')} <em>${escape(op.description ?? '')}</em></p>
${params.length ? `<p>Parameters: ${params.map((p) => `<code>${escape(p.name)}</code> (${escape(p.in)}${p.required ? ', required' : ''})`).join(', ')}</p>${json(params)}` : ''}
${body ? `<h4>Request body</h4>${schemasOf(body.content)}` : ''}
<h4>Responses</h4>
<ul>${responses.map(([status, r]) => `<li><strong>${escape(status)}</strong> ${escape(r.description ?? '')}${schemasOf(r.content)}</li>`).join('')}</ul>
</section>`;
}

/**
 * The OpenAPI document as one self-contained page to read (outside production): no script, no
 * outside stylesheet or font, so it loads under the app's Content-Security-Policy as it is.
 */
export function docsPage(doc: oas31.OpenAPIObject): string {
  const ops: { tag: string; html: string; path: string; method: string }[] = [];
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item?.[method];
      if (op) ops.push({ tag: op.tags?.[0] ?? 'other', html: operationHtml(path, method, op), path, method });
    }
  }
  const tags = [...new Set(ops.map((o) => o.tag))];
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escape(doc.info.title)}</title>
<style>
body{font:15px/1.5 system-ui,sans-serif;max-width:60rem;margin:0 auto;padding:1rem;color:#222}
section{border-top:1px solid #ddd;padding:.25rem 0}h3{font-size:1rem;margin:.5rem 0}
.m{display:inline-block;min-width:4.5em;font:bold 12px monospace;padding:2px 4px;border-radius:3px;background:#eee}
.get{background:#dbeafe}.post{background:#dcfce7}.patch{background:#fef3c7}.delete{background:#fee2e2}
pre{background:#f6f6f6;padding:.5rem;overflow:auto;max-height:30rem;font-size:12px}summary{cursor:pointer}
</style></head><body>
<h1>${escape(doc.info.title)}</h1>
<p>${escape(doc.info.description ?? '')}</p>
<p>The document itself: <a href="/api/openapi.json">/api/openapi.json</a> (OpenAPI ${escape(doc.openapi)}).</p>
<nav><ul>${tags.map((t) => `<li><a href="#tag-${escape(t)}">${escape(t)}</a></li>`).join('')}</ul></nav>
${tags
  .map(
    (t) =>
      `<h2 id="tag-${escape(t)}">${escape(t)}</h2>${ops
        .filter((o) => o.tag === t)
        .map((o) => o.html)
        .join('\n')}`,
  )
  .join('\n')}
<h2>Named schemas</h2>
${Object.entries(doc.components?.schemas ?? {})
  .map(
    ([name, schema]) =>
      `<details id="schema-${escape(name)}"><summary>${escape(name)}</summary>${json(schema)}</details>`,
  )
  .join('\n')}
</body></html>`;
}
