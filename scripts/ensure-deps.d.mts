// Types of scripts/ensure-deps.mjs for the TypeScript tests (the script itself stays plain JavaScript).
export interface Machine {
  readonly hasPackages: boolean;
  readonly lacking?: readonly string[];
  readonly wantBrowser: boolean;
  readonly hasChromium: boolean;
  readonly chromium: string;
  readonly canInstallSystemPackages: boolean;
}

export interface InstallStep {
  readonly what: string;
  readonly why: string;
  readonly commands: string[];
}

export function planInstall(machine: Machine): { steps: InstallStep[]; notes: string[] };
export function lackingPackages(lockText: string, installedText: string): string[];
