//! Compiles the generated parser (`src/parser.c`, committed, so building needs no
//! tree-sitter generator) into the crate with the `cc` crate.

fn main() {
    let src = std::path::Path::new("src");
    cc::Build::new()
        .std("c11")
        .include(src)
        .file(src.join("parser.c"))
        .warnings(false)
        .compile("tree-sitter-parax");
    println!("cargo:rerun-if-changed=src/parser.c");
    println!("cargo:rerun-if-changed=src/tree_sitter/parser.h");
}
