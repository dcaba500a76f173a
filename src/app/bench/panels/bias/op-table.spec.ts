import { TestBed } from '@angular/core/testing';
import { NODE_COLUMNS, type NodeRow } from './bias-rows';
import { OpTable, ROWS_PER_FRAME } from './op-table';

function nodes(count: number, volts = 1): NodeRow[] {
  return Array.from({ length: count }, (_, k) => ({ name: `n${k}`, v: volts + k / 1000 }));
}

async function render(rows: NodeRow[]) {
  const fixture = TestBed.createComponent(OpTable<NodeRow>);
  fixture.componentRef.setInput('label', 'Node voltages');
  fixture.componentRef.setInput('columns', NODE_COLUMNS);
  fixture.componentRef.setInput('rows', rows);
  await fixture.whenStable();
  const el = fixture.nativeElement as HTMLElement;
  return { fixture, bodyRows: () => [...el.querySelectorAll('tbody tr')] };
}

describe('OpTable', () => {
  it(`builds a long table ${ROWS_PER_FRAME} rows a frame, so no frame is long, until every row is there`, async () => {
    const { fixture, bodyRows } = await render(nodes(3 * ROWS_PER_FRAME + 5));
    expect(bodyRows().length).toBeLessThan(3 * ROWS_PER_FRAME + 5);
    expect(bodyRows().length).toBeGreaterThanOrEqual(ROWS_PER_FRAME);
    await vi.waitFor(async () => {
      await fixture.whenStable();
      expect(bodyRows()).toHaveLength(3 * ROWS_PER_FRAME + 5);
    });
    expect(bodyRows()[3 * ROWS_PER_FRAME + 4].textContent).toContain(`n${3 * ROWS_PER_FRAME + 4}`);
  });

  it('updates the cells of the same rows for a new result of the same circuit', async () => {
    const { fixture, bodyRows } = await render(nodes(5, 1));
    const before = bodyRows();
    expect(before[2].textContent).toContain('1.00 V');
    fixture.componentRef.setInput('rows', nodes(5, 2));
    await fixture.whenStable();
    const after = bodyRows();
    // The very same elements, with the new values (rows are tracked by name).
    expect(after.every((tr, k) => tr === before[k])).toBe(true);
    expect(after[2].textContent).toContain('2.00 V');
  });
});
