//! `strake fill-height`: the inverse one-foot relation (API 653 4.3.3.1, methods.md
//! s.4) for several specific gravities, worked by hand on the small SI tank.

use crate::support::{SMALL_SI_TANK, TankFixture, close, json, num, strake};

fn tank() -> TankFixture {
    TankFixture::new(SMALL_SI_TANK).survey(
        "s.csv",
        "date,course,thickness\n2014-06-01,1,9.40\n2024-06-01,1,8.90\n\
         2014-06-01,2,7.70\n2024-06-01,2,7.72\n2014-06-01,3,5.80\n2024-06-01,3,5.40\n",
    )
}

/// SG 1.0, D 30 m (4.9 x 30 x 1.0 = 147):
///   course 1: 171.6 x 8.90 / 147 + 0.3 = 10.6894 m
///   course 2: 171.6 x 7.72 / 147 + 0.3 + 2.5 = 11.8118 m
///   course 3: 188.8 x 5.40 / 147 + 0.3 + 5.0 = 12.2355 m    -> 10.6894 m, course 1
/// After 10 years (rates 0.0499932 / 0 / 0.0399945 mm/y, see assess.rs):
///   course 1: 8.90 - 0.499932 = 8.400068 -> 171.6 x 8.400068 / 147 + 0.3 = 10.1058 m
///   course 3: 5.40 - 0.399945 = 5.000055 -> 188.8 x 5.000055 / 147 + 5.3 = 11.7218 m
///                                                            -> 10.1058 m, course 1
/// Stored product SG 0.85 (4.9 x 30 x 0.85 = 124.95): course 1 now 12.5228 m.
#[test]
fn other_specific_gravities_by_hand() {
    let fx = tank();
    let run = strake([
        "fill-height",
        fx.path().to_str().expect("utf-8 path"),
        "--sg",
        "1.0",
        "--years",
        "10",
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    assert_eq!(num(&v, "/years"), 10.0);
    assert_eq!(v["scenarios"][0]["stored_product"], true);
    assert!(close(
        num(&v, "/scenarios/0/max_fill_height"),
        12.5228,
        0.0005
    ));
    assert_eq!(num(&v, "/scenarios/1/specific_gravity"), 1.0);
    assert!(close(
        num(&v, "/scenarios/1/max_fill_height"),
        10.6894,
        0.0005
    ));
    assert_eq!(v["scenarios"][1]["governing_course"], 1);
    assert!(close(
        num(&v, "/scenarios/1/courses/1/max_fill_height"),
        11.8118,
        0.0005
    ));
    assert!(close(
        num(&v, "/scenarios/1/courses/2/max_fill_height"),
        12.2355,
        0.0005
    ));
    assert!(close(
        num(&v, "/scenarios/1/max_fill_height_later"),
        10.1058,
        0.0005
    ));
    assert!(close(
        num(&v, "/scenarios/1/courses/2/max_fill_height_later"),
        11.7218,
        0.0005
    ));
}

/// Higher SG never raises the allowable level (the level falls as 1/G).
#[test]
fn heavier_product_lowers_the_level() {
    let fx = tank();
    let dir = fx.path().to_str().expect("utf-8 path");
    let v = json(&strake([
        "fill-height",
        dir,
        "--sg",
        "0.7",
        "--sg",
        "1.0",
        "--sg",
        "1.4",
        "--format",
        "json",
    ]));
    let levels: Vec<f64> = (1..=3)
        .map(|i| num(&v, &format!("/scenarios/{i}/max_fill_height")))
        .collect();
    assert!(levels[0] > levels[1] && levels[1] > levels[2], "{levels:?}");
}

/// Text output: one line per SG, the default years = the tank's UT interval (15 y).
#[test]
fn text_table() {
    let fx = tank();
    let run = strake([
        "fill-height",
        fx.path().to_str().expect("utf-8 path"),
        "--sg",
        "1.0",
    ]);
    assert_eq!(run.code, 0);
    assert!(
        run.stdout.contains("'later' = after 15.0 years"),
        "{}",
        run.stdout
    );
    assert!(
        run.stdout
            .contains(" 0.850  stored product      12.52       1      11.49       1"),
        "{}",
        run.stdout
    );
    assert!(
        run.stdout
            .contains(" 1.000  what-if             10.69       1"),
        "{}",
        run.stdout
    );
    assert!(run.stdout.contains("Caution: Screening aid only."));
}
