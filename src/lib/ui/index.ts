// Public face of src/lib/ui: other folders import only this file.
export {};
