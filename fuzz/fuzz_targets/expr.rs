//! Expressions: any text must parse and evaluate over a small table with
//! every column type and NULLs, or fail with a located error; never panic.
#![no_main]
use libfuzzer_sys::fuzz_target;
use std::sync::OnceLock;

const TABLE: &str = "i,x,s,b,d,t\n1,1.5,a,true,2024-01-31,2024-01-31T10:00:00Z\n-7,,It's,false,,2000-02-29T00:00:00Z\n,0.0,,,1969-12-31,\n9223372036854775807,-2.5e10,Ünï,true,2024-02-29,2024-02-29T23:59:59Z\n";

fuzz_target!(|data: &[u8]| {
    static T: OnceLock<strata::data::Table> = OnceLock::new();
    let table = T.get_or_init(|| strata::data::read(TABLE.as_bytes(), &Default::default()).unwrap());
    let Ok(text) = std::str::from_utf8(data) else { return };
    match strata::expr::evaluate(table, text) {
        Ok(col) => assert_eq!(col.len(), table.num_rows()),
        Err(e) => {
            let _ = e.render(text);
        }
    }
});
