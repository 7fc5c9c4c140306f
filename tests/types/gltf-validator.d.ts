// Types of the parts of gltf-validator (a JavaScript build without declarations) the tests use.
declare module 'gltf-validator' {
  export interface ValidationMessage {
    readonly code: string;
    readonly message: string;
    readonly severity: number;
    readonly pointer?: string;
  }
  export interface ValidationReport {
    readonly issues: {
      readonly numErrors: number;
      readonly numWarnings: number;
      readonly numInfos: number;
      readonly numHints: number;
      readonly messages: readonly ValidationMessage[];
      readonly truncated: boolean;
    };
    readonly info?: Record<string, unknown>;
  }
  export interface ValidationOptions {
    readonly uri?: string;
    readonly format?: 'glb' | 'gltf';
    readonly maxIssues?: number;
    readonly writeTimestamp?: boolean;
    readonly ignoredIssues?: readonly string[];
    readonly severityOverrides?: Record<string, number>;
  }
  export function validateBytes(data: Uint8Array, options?: ValidationOptions): Promise<ValidationReport>;
  export function version(): string;
}
