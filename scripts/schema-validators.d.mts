export declare const AJV_OPTIONS: { allErrors: true; strict: false; allowUnionTypes: true };
export declare function renderValidatorsModule(schemaTexts: Record<string, string>): string;
