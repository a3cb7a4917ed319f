//! Whole specs with expressions (issue 16): any spec text, rendered over a
//! small table with every column type and NULLs, must draw or fail with
//! located errors; never panic, never overflow the stack (long operator
//! chains), never exhaust memory (log bases, budgets).
#![no_main]
use libfuzzer_sys::fuzz_target;

const TABLE: &str = "i,x,s,b,d,t\n1,1.5,a,true,2024-01-31,2024-01-31T10:00:00Z\n-7,,It's,false,,2000-02-29T00:00:00Z\n,0.0,,,1969-12-31,\n9223372036854775807,-2.5e10,Ünï,true,2024-02-29,2024-02-29T23:59:59Z\n";

fuzz_target!(|data: &[u8]| {
    let Ok(text) = std::str::from_utf8(data) else { return };
    let bytes = strata::DataBytes { bytes: TABLE.as_bytes(), name: "t.csv" };
    match strata::render(text, Some(bytes), &Default::default()) {
        Ok(r) => assert!(r.svg.starts_with("<svg")),
        Err(e) => {
            for d in &e.0 {
                assert!(d.to_string().len() < 10_000);
            }
        }
    }
});
