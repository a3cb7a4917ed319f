//! The engine's modules form a graph without cycles, and the scene never
//! sees the spec.
//!
//! The graph is read from the source text: every `use crate::x...` line
//! (with `use crate::{x, y::z}` groups) and every inline `crate::x::` path in
//! `crates/strata/src`, outside comments and outside test code (items under
//! `#[cfg(test)]`, and files declared as `#[cfg(test)] mod x;`).
//! A node is a top-level module: a file `src/foo.rs` or a folder `src/foo/`.
//! `lib.rs` is the driver that runs the stages and is not a node.
//!
//! Run it alone with `cargo test -p strata --test module_graph`.

use std::collections::{BTreeMap, BTreeSet};
use std::path::{Path, PathBuf};

fn src() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("src")
}

/// Every `.rs` file under `dir`.
fn rust_files(dir: &Path, out: &mut Vec<PathBuf>) {
    let mut entries: Vec<PathBuf> = std::fs::read_dir(dir).unwrap().map(|e| e.unwrap().path()).collect();
    entries.sort();
    for p in entries {
        if p.is_dir() {
            rust_files(&p, out);
        } else if p.extension().is_some_and(|e| e == "rs") {
            out.push(p);
        }
    }
}

/// The top-level modules: `src/foo.rs` and `src/foo/`.
fn top_modules() -> BTreeSet<String> {
    std::fs::read_dir(src())
        .unwrap()
        .map(|e| e.unwrap().path())
        .filter_map(|p| {
            let name = p.file_stem()?.to_str()?.to_string();
            (p.is_dir() || p.extension().is_some_and(|e| e == "rs")).then_some(name)
        })
        .filter(|n| n != "lib")
        .collect()
}

/// The top-level module a file belongs to, `None` for `lib.rs`.
fn owner(file: &Path) -> Option<String> {
    let rel = file.strip_prefix(src()).unwrap();
    let first = rel.components().next()?.as_os_str().to_str()?.to_string();
    let name = first.strip_suffix(".rs").unwrap_or(&first).to_string();
    (name != "lib").then_some(name)
}

/// Files that only exist in test builds: `#[cfg(test)] mod x;` names the
/// sibling `x.rs`, or with `#[path = "y.rs"]` the file `y.rs`.
fn test_only_files(files: &[PathBuf]) -> BTreeSet<PathBuf> {
    let mut out = BTreeSet::new();
    for f in files {
        let text = std::fs::read_to_string(f).unwrap();
        let lines: Vec<&str> = text.lines().map(str::trim).collect();
        for (i, l) in lines.iter().enumerate() {
            if *l != "#[cfg(test)]" {
                continue;
            }
            let mut path = None;
            for next in &lines[i + 1..] {
                if let Some(p) = next.strip_prefix("#[path = \"").and_then(|r| r.strip_suffix("\"]")) {
                    path = Some(p.to_string());
                } else if next.starts_with("#[") {
                    continue;
                } else {
                    if let Some(name) = next.strip_prefix("mod ").and_then(|r| r.strip_suffix(';')) {
                        out.insert(f.parent().unwrap().join(path.take().unwrap_or(format!("{name}.rs"))));
                    }
                    break;
                }
            }
        }
    }
    out
}

/// The source a build without tests compiles: comments and `#[cfg(test)]`
/// items removed. An item under `#[cfg(test)]` ends at its line `;` or, for
/// a block, at the `}` line with the attribute's indentation (as rustfmt
/// writes it).
fn code_of(text: &str) -> String {
    let mut out = String::new();
    let mut lines = text.lines();
    while let Some(line) = lines.next() {
        let t = line.trim();
        if t == "#[cfg(test)]" {
            let indent = &line[..line.len() - line.trim_start().len()];
            let close = format!("{indent}}}");
            // Further attributes, then the item's first line.
            let first = lines.by_ref().find(|l| !l.trim().starts_with("#[")).unwrap_or_default();
            if !first.trim_end().ends_with(';') && !first.trim_end().ends_with('}') {
                // A block: skip to its closing line.
                lines.by_ref().find(|l| l.trim_end() == close);
            }
            continue;
        }
        if t.starts_with("//") {
            continue;
        }
        // A trailing comment; `//` inside a string literal is rare enough in
        // this code base that cutting there loses no `crate::` path.
        let code = match line.find("//") {
            Some(i) if !line[..i].contains('"') => &line[..i],
            _ => line,
        };
        out.push_str(code);
        out.push('\n');
    }
    out
}

/// The top-level modules a piece of code names: `crate::x` anywhere, and the
/// first names inside `use crate::{...}` groups.
fn named_modules(code: &str, modules: &BTreeSet<String>) -> BTreeSet<String> {
    let mut out = BTreeSet::new();
    let mut rest = code;
    while let Some(i) = rest.find("crate::") {
        let before = rest[..i].chars().last();
        rest = &rest[i + "crate::".len()..];
        if before.is_some_and(|c| c.is_alphanumeric() || c == '_') {
            continue; // `some_crate::`, not ours
        }
        if let Some(group) = rest.strip_prefix('{') {
            // `use crate::{a, b::c, d::{e, f}}`: the names at depth 0.
            let mut depth = 0;
            let mut item = String::new();
            let mut firsts = Vec::new();
            let mut at_start = true;
            for c in group.chars() {
                match c {
                    '{' => depth += 1,
                    '}' if depth == 0 => break,
                    '}' => depth -= 1,
                    ',' if depth == 0 => {
                        firsts.push(std::mem::take(&mut item));
                        at_start = true;
                    }
                    c if depth == 0 && at_start && (c.is_alphanumeric() || c == '_') => item.push(c),
                    c if depth == 0 && !item.is_empty() && !(c.is_alphanumeric() || c == '_') => at_start = false,
                    _ => {}
                }
            }
            firsts.push(item);
            out.extend(firsts.into_iter().filter(|n| modules.contains(n)));
        } else {
            let name: String = rest.chars().take_while(|c| c.is_alphanumeric() || *c == '_').collect();
            if modules.contains(&name) {
                out.insert(name);
            }
        }
    }
    out
}

/// Module -> the modules it names.
fn graph() -> BTreeMap<String, BTreeSet<String>> {
    let modules = top_modules();
    let mut files = Vec::new();
    rust_files(&src(), &mut files);
    let tests_only = test_only_files(&files);
    let mut g: BTreeMap<String, BTreeSet<String>> = modules.iter().map(|m| (m.clone(), BTreeSet::new())).collect();
    for f in &files {
        if tests_only.contains(f) {
            continue;
        }
        let Some(me) = owner(f) else { continue };
        let code = code_of(&std::fs::read_to_string(f).unwrap());
        for m in named_modules(&code, &modules) {
            if m != me {
                g.get_mut(&me).unwrap().insert(m);
            }
        }
    }
    g
}

/// A cycle in the graph, as the list of modules around it, if there is one.
fn find_cycle(g: &BTreeMap<String, BTreeSet<String>>) -> Option<Vec<String>> {
    // Depth-first search; 0 = unseen, 1 = on the stack, 2 = done.
    fn visit(n: &str, g: &BTreeMap<String, BTreeSet<String>>, state: &mut BTreeMap<String, u8>, stack: &mut Vec<String>) -> Option<Vec<String>> {
        state.insert(n.to_string(), 1);
        stack.push(n.to_string());
        for m in &g[n] {
            match state.get(m).copied().unwrap_or(0) {
                1 => {
                    let from = stack.iter().position(|s| s == m).unwrap();
                    let mut cycle = stack[from..].to_vec();
                    cycle.push(m.clone());
                    return Some(cycle);
                }
                0 => {
                    if let Some(c) = visit(m, g, state, stack) {
                        return Some(c);
                    }
                }
                _ => {}
            }
        }
        stack.pop();
        state.insert(n.to_string(), 2);
        None
    }
    let mut state = BTreeMap::new();
    for n in g.keys() {
        if state.get(n).copied().unwrap_or(0) == 0 {
            if let Some(c) = visit(n, g, &mut state, &mut Vec::new()) {
                return Some(c);
            }
        }
    }
    None
}

#[test]
fn modules_form_no_cycle() {
    let g = graph();
    // The reader must see the graph at all: the stages hand on in order.
    assert!(g["plan"].contains("spec") && g["scene"].contains("plan") && g["svg"].contains("scene"), "{g:#?}");
    if let Some(c) = find_cycle(&g) {
        panic!("module cycle: {}\n(the whole graph: {g:#?})", c.join(" -> "));
    }
}

#[test]
fn scene_never_names_the_spec() {
    let g = graph();
    assert!(!g["scene"].contains("spec"), "scene names spec; the scene reads only the plan: {:?}", g["scene"]);
}

#[test]
fn the_reader_finds_cycles_and_groups() {
    // The checker checked: a made-up graph with a cycle, and a `use` group.
    let modules: BTreeSet<String> = ["a", "b", "c"].iter().map(|s| s.to_string()).collect();
    assert_eq!(named_modules("use crate::{a::X, b::{self, Y}};\nfn f() { crate::c::g(); other_crate::a::h(); }", &modules), modules);
    assert!(named_modules("use strata_crate::a;", &modules).is_empty());
    assert_eq!(code_of("use crate::a; // crate::b\n// crate::c\n#[cfg(test)]\nmod tests {\n    use crate::c;\n}\nfn f() {}\n"), "use crate::a; \nfn f() {}\n");
    assert_eq!(code_of("#[cfg(test)]\n#[path = \"t.rs\"]\nmod t;\nuse crate::b;\n"), "use crate::b;\n");
    let mut g: BTreeMap<String, BTreeSet<String>> = BTreeMap::new();
    g.insert("a".into(), ["b".to_string()].into());
    g.insert("b".into(), ["c".to_string()].into());
    g.insert("c".into(), BTreeSet::new());
    assert_eq!(find_cycle(&g), None);
    g.get_mut("c").unwrap().insert("a".into());
    assert_eq!(find_cycle(&g), Some(vec!["a".into(), "b".into(), "c".into(), "a".into()]));
}
