import { hash, verify } from '@node-rs/argon2';

/** argon2id cost: memory in KiB, passes and lanes. */
export interface HashCost {
  readonly memoryCost: number;
  readonly timeCost: number;
  readonly parallelism: number;
}

/** The argon2 version @node-rs/argon2 writes (0x13, RFC 9106); older hashes are replaced. */
const ARGON2_VERSION = 19;

/** The cost for real accounts: OWASP's argon2id minimum (19 MiB, 2 passes, 1 lane). */
export const PRODUCTION_COST: HashCost = { memoryCost: 19_456, timeCost: 2, parallelism: 1 };

/**
 * A deliberately cheap cost for test runs only, which hash hundreds of passwords on two shared
 * cores. The parameters are written into each hash, so verification never depends on it.
 */
export const TEST_COST: HashCost = { memoryCost: 1024, timeCost: 1, parallelism: 1 };

/** The cost for an environment: cheap only under `test`. */
export function hashCostFor(nodeEnv: string | undefined): HashCost {
  return nodeEnv === 'test' ? TEST_COST : PRODUCTION_COST;
}

/**
 * Hashes and checks passwords with argon2id. Unknown accounts are checked against a dummy hash
 * of the same cost, so a sign-in takes as long whether or not the account exists.
 */
export class PasswordHasher {
  private dummy: Promise<string> | undefined;

  constructor(private readonly cost: HashCost) {}

  /** The PHC string of `password` (salted; parameters included). */
  hash(password: string): Promise<string> {
    return hash(password, this.cost);
  }

  /** Whether `password` matches `stored`; a malformed hash simply does not match. */
  async verify(stored: string, password: string): Promise<boolean> {
    try {
      return await verify(stored, password);
    } catch {
      return false;
    }
  }

  /**
   * Whether a stored hash was made more cheaply than this hasher's cost (or with another
   * algorithm or version), so it should be replaced at the next sign-in, when the password is
   * at hand. A hash of a higher cost is kept: lowering the cost never weakens stored hashes.
   */
  needsRehash(stored: string): boolean {
    const phc = /^\$(argon2(?:id|i|d))\$v=(\d+)\$m=(\d+),t=(\d+),p=(\d+)\$/.exec(stored);
    if (!phc) return true;
    const [, algorithm, version, m, t, p] = phc;
    return (
      algorithm !== 'argon2id' ||
      Number(version) < ARGON2_VERSION ||
      Number(m) < this.cost.memoryCost ||
      Number(t) < this.cost.timeCost ||
      Number(p) < this.cost.parallelism
    );
  }

  /** Spends the time of one verification and answers false (the account does not exist). */
  async verifyNobody(password: string): Promise<false> {
    this.dummy ??= this.hash('no account has this password; it only costs time');
    await this.verify(await this.dummy, password);
    return false;
  }
}
