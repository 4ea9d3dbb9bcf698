// Public face of src/lib/domain: other folders import only this file.
export {};
