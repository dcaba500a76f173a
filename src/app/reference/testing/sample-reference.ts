/**
 * A short reference in the shape of docs/netlist.md (title, intro, numbered chapters with `###`
 * sections, code, a table, a caution), for the specs. The browser tests read the real one.
 */
export const SAMPLE_REFERENCE = `# Writing netlists

The user reference for \`.nwl\` files.

> **Caution.** First-order models.

## 1. A first netlist

\`\`\`
r1: res(a, gnd) 1k
\`\`\`

## 5. Analyses

The operating point is always solved.

### analyze ac

\`\`\`
analyze ac from 10 Hz to 1 GHz per decade 20
\`\`\`

A small-signal sweep.

### analyze transfer

Steps one source's DC value.

### Later analyses

\`analyze noise\` and \`analyze poles\` parse today and are skipped with a warning.

## 7. Measures

| function | gives |
| --- | --- |
| \`db(x)\` | 20·log10 of a class of <b>value</b> |

## 9. Diagnostics

Every problem carries a line.<img src=x onerror="alert(1)"><script>alert(2)</script>
`;
