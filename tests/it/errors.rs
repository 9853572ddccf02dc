//! Bad input. The cases live as data in `tests/corpus/` (one folder per case, with its
//! whole expected error line; see `corpus.rs`); this file keeps what is not a file:
//! usage errors, which clap reports with exit 2.

use crate::support::strake;

/// Usage errors are clap's: exit 2.
#[test]
fn usage_error_exits_2() {
    let run = strake(["assess"]);
    assert_eq!(run.code, 2);
    let run = strake(["assess", ".", "--sg", "4"]);
    assert_eq!(run.code, 2);
    assert!(
        run.stderr
            .contains("4 is out of range, expected more than 0 and at most 3"),
        "{}",
        run.stderr
    );
}
