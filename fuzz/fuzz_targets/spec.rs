//! Spec JSON: parsing, the shape check and lint must never panic, and an
//! accepted spec's derive/where must evaluate or fail cleanly.
#![no_main]
use libfuzzer_sys::fuzz_target;

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else { return };
    if let Ok(spec) = strata::parse_spec(text) {
        let _ = strata::lint::check(&spec, None);
        if let Some(rows) = spec.data.as_ref().and_then(|d| d.object().rows) {
            if let Ok(table) = strata::data::from_rows(&rows, &Default::default()) {
                let _ = strata::expr::apply(table, &spec.derive, spec.where_.as_deref());
            }
        }
    }
});
