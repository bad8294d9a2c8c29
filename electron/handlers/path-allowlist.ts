/**
 * Paths main may read on the renderer's behalf: only those the user chose (in a dialog, from the
 * recent list, or referenced by a work file the user opened). A renderer cannot make main read
 * anything else, e.g. `~/.ssh/id_rsa`.
 */
import { resolve } from 'node:path';

export class PathAllowlist {
  private readonly allowed = new Set<string>();

  allow(path: string): void {
    this.allowed.add(resolve(path));
  }

  allows(path: string): boolean {
    return this.allowed.has(resolve(path));
  }
}
