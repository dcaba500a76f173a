/**
 * Before a netlist without blocks is proposed as one: the block's name and which of its nodes
 * become pins (those its sources drive are ticked to start with; the rest stay inside).
 */
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

export interface BlockPinsData {
  /** The netlist's nodes, in netlist order (ground left out). */
  nodes: string[];
  /** Ticked to start with. */
  pins: string[];
  name: string;
}

export interface BlockPinsResult {
  name: string;
  pins: string[];
}

const NAME = /^[a-z][a-z0-9_]{0,59}$/;

@Component({
  selector: 'nw-block-pins-dialog',
  imports: [MatDialogModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatInputModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Propose this netlist as a block</h2>
    <form (submit)="$event.preventDefault(); done()">
      <mat-dialog-content>
        <p class="lead">Its parts become the block; its sources, analyses and ports become the fixture that solves it. Tick the nodes that become pins.</p>
        <mat-form-field appearance="outline" class="name">
          <mat-label>Block name</mat-label>
          <input matInput name="name" [value]="name()" (input)="name.set($any($event.target).value.trim())" autocomplete="off" spellcheck="false" required />
          <mat-hint>Lower case, digits and _, starting with a letter.</mat-hint>
        </mat-form-field>
        <fieldset>
          <legend>Pins</legend>
          <div class="nodes">
            @for (node of data.nodes; track node) {
              <mat-checkbox [checked]="chosen().has(node)" (change)="toggle(node, $event.checked)">{{ node }}</mat-checkbox>
            }
          </div>
        </fieldset>
        @if (problem(); as p) { <p class="problem" role="alert">{{ p }}</p> }
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit">Continue</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .lead { margin-top: 0; max-width: 60ch; }
    .name { width: 100%; max-width: 360px; }
    fieldset { border: 1px solid var(--mat-sys-outline-variant); border-radius: 8px; margin: 8px 0 0; padding: 4px 12px 8px; }
    legend { padding: 0 4px; font-weight: 600; }
    .nodes { display: grid; grid-template-columns: repeat(auto-fill, minmax(120px, 1fr)); gap: 0 8px; max-height: 40vh; overflow: auto; }
    .problem { color: #8c1d18; }
  `,
})
export class BlockPinsDialog {
  protected readonly data = inject<BlockPinsData>(MAT_DIALOG_DATA);
  private readonly ref = inject<MatDialogRef<BlockPinsDialog, BlockPinsResult>>(MatDialogRef);
  protected readonly name = signal(this.data.name);
  protected readonly chosen = signal(new Set(this.data.pins));
  private readonly tried = signal(false);
  protected readonly problem = computed(() => {
    if (!this.tried()) return undefined;
    if (!NAME.test(this.name())) return 'The name is lower case letters, digits and _, starting with a letter.';
    if (this.chosen().size === 0) return 'Tick at least one node: a block with no pins connects to nothing.';
    return undefined;
  });

  protected toggle(node: string, on: boolean): void {
    this.chosen.update((s) => {
      const next = new Set(s);
      if (on) next.add(node);
      else next.delete(node);
      return next;
    });
  }

  protected done(): void {
    this.tried.set(true);
    if (this.problem()) return;
    // Pins in netlist order, whatever order they were ticked in.
    this.ref.close({ name: this.name(), pins: this.data.nodes.filter((n) => this.chosen().has(n)) });
  }
}
