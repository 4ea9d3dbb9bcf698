// Public face of src/lib/sensors: other folders import only this file.
export {};
