//! The caution every output carries.

/// One paragraph, shown at the end of every output and in every file written.
pub const CAUTION: &str = "Screening aid only. strake applies published formulas (API 653 \
in-service evaluation, API 650 one-foot method) to the readings it is given. It does not \
replace the judgement of an authorized tank inspector or a qualified engineer, the owner's \
procedures, or the code edition and local regulations that apply to the tank. Settlement, \
bottom plates, roofs, nozzles, brittle fracture, cracks and weld flaws are outside what it \
assesses.";
