// Package setup is the setup file format: its key table (every table and
// key with its kind, dimensions, choices and requirements), the element
// kinds' keys and readers, the loader (a layout prescan for line numbers and
// limits, TOML decoding, checking, linking paths, combiners and clouds), the
// JSON Schema written from the key table, the syntax of tolerances, the
// cloud frame and the check that a stated detuning agrees with the
// wavelengths.
//
// Sources and conventions:
//   - Quantities are read by package units into SI base units; the key
//     table states each key's dimension and physical range.
//   - Positions along a path are free-space distances from its start.
//   - A cloud's frame: rms_size = [x, y, z]; a beam's x plane contains the
//     first cloud axis (x, then y, then z) that is not along the beam.
//   - Errors name the file, line, context and field, and are collected as
//     one *InputError.
//
// # Formulas
//
//	| quantity | expression | source | function | test |
//	| --- | --- | --- | --- | --- |
//	| light frequency | ν = c/λ + AOM shifts | CODATA c; Steck Rb-87 table 3 | LightFrequency | TestLightFrequency |
//	| default viewing duration | 0.25 s in 400–700 nm, else 10 s | IEC 60825-1:2014 (from memory) | DefaultViewingDuration | TestDefaultViewingDuration |
//	| beam axes in the cloud frame | x plane ∋ first cloud axis not along the beam | our convention | BeamAxes | TestBeamAxes |
//	| cloud rms along a direction | √Σ dᵢ² σᵢ² | Gaussian cloud | Cloud.RMSAlong | TestBeamAxes |
package setup
