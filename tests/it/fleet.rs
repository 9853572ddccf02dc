//! `strake fleet`: every tank folder below a folder, in planning order, with broken
//! folders listed and the others assessed.

use std::path::Path;

use crate::support::{SMALL_SI_TANK, TankFixture, json, root, strake};

/// Copies a sample tank folder to `to` (tank.toml and surveys/), with its id replaced.
fn copy_sample(name: &str, to: &Path, id: Option<&str>) {
    let from = root().join("sample-inspections").join(name);
    std::fs::create_dir_all(to.join("surveys")).expect("mkdir");
    let mut toml = std::fs::read_to_string(from.join("tank.toml")).expect("tank.toml");
    if let Some(id) = id {
        let old = toml
            .lines()
            .find(|l| l.starts_with("id = "))
            .expect("id line")
            .to_string();
        toml = toml.replace(&old, &format!("id = \"{id}\""));
    }
    std::fs::write(to.join("tank.toml"), toml).expect("write");
    for f in std::fs::read_dir(from.join("surveys")).expect("surveys") {
        let f = f.expect("entry").path();
        std::fs::copy(&f, to.join("surveys").join(f.file_name().expect("name"))).expect("copy");
    }
}

#[test]
fn sample_fleet_snapshots() {
    for (format, ext) in [("text", "txt"), ("json", "json"), ("csv", "csv")] {
        let run = strake(["fleet", "sample-inspections", "--format", format]);
        assert_eq!(run.code, 0, "{format}: {}", run.stderr);
        // Piped standard error: no progress bar; with CSV only the caution (the CSV rows
        // have no place for it).
        if format == "csv" {
            assert!(
                run.stderr.starts_with("caution: Screening aid only."),
                "{}",
                run.stderr
            );
            assert_eq!(run.stderr.lines().count(), 1, "{}", run.stderr);
        } else {
            assert!(run.stderr.is_empty(), "{}", run.stderr);
        }
        insta::assert_snapshot!(format!("fleet-samples-{ext}"), run.stdout);
    }
}

/// Each fleet line carries the same values as the tank's own assessment, and the
/// next due date is the earlier of its two dates (API 653 6.3 intervals, from the
/// assessment).
#[test]
fn lines_agree_with_each_assessment() {
    let fleet = json(&strake(["fleet", "sample-inspections", "--format", "json"]));
    let tanks = fleet["tanks"].as_array().expect("tanks");
    assert_eq!(tanks.len(), 3);
    for t in tanks {
        let folder = t["folder"].as_str().expect("folder");
        let a = json(&strake(["assess", folder, "--format", "json"]));
        assert_eq!(t["tank_id"], a["tank_id"]);
        for (f, g) in [
            ("governing_course", "governing_course"),
            ("remaining_life_years", "remaining_life_years"),
            ("next_ut_inspection", "next_ut_inspection"),
            ("next_external_inspection", "next_external_inspection"),
            ("latest_survey", "latest_survey"),
            ("operating_fill_height", "operating_fill_height"),
        ] {
            assert_eq!(t[f], a["tank"][g], "{folder}: {f}");
        }
        let ut = a["tank"]["next_ut_inspection"].as_str().expect("ut");
        let ext = a["tank"]["next_external_inspection"].as_str().expect("ext");
        assert_eq!(t["next_due"].as_str(), Some(ut.min(ext)), "{folder}");
        // Allowable level: the least over the courses, at most the shell height.
        let shell: f64 = a["courses"]
            .as_array()
            .expect("courses")
            .iter()
            .map(|c| c["height"].as_f64().expect("height"))
            .sum();
        let least = a["tank"]["max_fill_height"].as_f64().expect("level");
        let allowed = t["allowable_fill_height"].as_f64().expect("allowed");
        assert!(
            (allowed - least.min(shell)).abs() < 1e-3,
            "{folder}: {allowed}"
        );
    }
}

/// Planning order: next due date ascending; equal dates by tank id. A copy of
/// KR-T12 under the id KR-T00 has the same due date and must come just before it.
#[test]
fn ordered_by_due_date_then_id() {
    let dir = tempfile::tempdir().expect("temp dir");
    copy_sample("kestrel-t12", &dir.path().join("a-site/t12"), None);
    copy_sample(
        "kestrel-t12",
        &dir.path().join("b-site/t00"),
        Some("KR-T00"),
    );
    copy_sample("kestrel-t03", &dir.path().join("b-site/t03"), None);
    copy_sample("kestrel-t07", &dir.path().join("c/d/e/t07"), None);
    let run = strake([
        "fleet",
        dir.path().to_str().expect("utf-8"),
        "--format",
        "json",
    ]);
    assert_eq!(run.code, 0, "{}", run.stderr);
    let v = json(&run);
    let tanks = v["tanks"].as_array().expect("tanks");
    let ids: Vec<&str> = tanks
        .iter()
        .map(|t| t["tank_id"].as_str().expect("id"))
        .collect();
    // Due dates, from the snapshot of each sample: KR-T07 2028-08-30 (external),
    // KR-T12 2028-10-01 (external), KR-T03 2030-10-07 (external).
    assert_eq!(ids, ["KR-T07", "KR-T00", "KR-T12", "KR-T03"]);
    let due: Vec<&str> = tanks
        .iter()
        .map(|t| t["next_due"].as_str().expect("due"))
        .collect();
    assert!(due.windows(2).all(|w| w[0] <= w[1]), "{due:?}");
}

/// A broken tank folder is listed with its error (file:line and value), the others
/// are assessed, and the exit code is 1.
#[test]
fn broken_folder_is_listed_and_exit_is_1() {
    let dir = tempfile::tempdir().expect("temp dir");
    copy_sample("kestrel-t12", &dir.path().join("t12"), None);
    let broken = TankFixture::new(SMALL_SI_TANK).survey(
        "a.csv",
        "date,course,thickness\n2024-01-01,1,9.0\n2024-01-01,x,9.0\n",
    );
    let target = dir.path().join("t99");
    std::fs::create_dir_all(target.join("surveys")).expect("mkdir");
    std::fs::copy(broken.path().join("tank.toml"), target.join("tank.toml")).expect("copy");
    std::fs::copy(
        broken.path().join("surveys/a.csv"),
        target.join("surveys/a.csv"),
    )
    .expect("copy");
    let root_arg = dir.path().to_str().expect("utf-8");
    let file = target.join("surveys/a.csv").display().to_string();
    let message = format!(
        "{file}:3: column \"course\": \"x\" is not a course number (expected a whole number, 1 = bottom course)"
    );

    let run = strake(["fleet", root_arg]);
    assert_eq!(run.code, 1);
    assert_eq!(run.stderr, format!("error: {message}\n"));
    assert!(run.stdout.contains("KR-T12"), "{}", run.stdout);
    assert!(run.stdout.contains("Errors (1)"), "{}", run.stdout);

    let run = strake(["fleet", root_arg, "--format", "json"]);
    assert_eq!(run.code, 1);
    let v = json(&run);
    assert_eq!(
        (v["assessed"].as_u64(), v["failed"].as_u64()),
        (Some(1), Some(1))
    );
    let last = &v["tanks"][1];
    assert_eq!(last["status"], "error");
    assert_eq!(last["tank_id"], "FX-1");
    assert_eq!(last["error"].as_str(), Some(message.as_str()));
    assert_eq!(v["tanks"][0]["status"], "monitor");

    let run = strake(["fleet", root_arg, "--format", "csv"]);
    assert_eq!(run.code, 1);
    let last = run.stdout.lines().last().expect("rows");
    assert!(last.starts_with("FX-1,,"), "{last}");
    assert!(last.contains(",error,"), "{last}");
}

/// A folder with no tank folder below it is an error of its own.
#[test]
fn no_tank_folder() {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::create_dir_all(dir.path().join("empty/sub")).expect("mkdir");
    let shown = dir.path().display().to_string();
    let run = strake(["fleet", &shown]);
    assert_eq!(run.code, 1);
    assert_eq!(
        run.stderr.trim_end(),
        format!("error: {shown}: no tank folder (a folder holding tank.toml) below this folder")
    );
}

/// A tank folder inside another tank folder is assessed too (nothing below the given
/// folder is left out without a word); a tank's surveys/ and scans/ are not searched
/// for tanks.
#[test]
fn tank_folder_inside_another_is_found() {
    let dir = tempfile::tempdir().expect("temp dir");
    copy_sample("kestrel-t03", &dir.path().join("outer"), Some("OUTER"));
    copy_sample(
        "kestrel-t07",
        &dir.path().join("outer/archive/inner"),
        Some("INNER"),
    );
    // A folder holding tank.toml under surveys/ is the outer tank's business (its
    // survey reader reports the folder as not read), not a tank of the fleet.
    copy_sample(
        "kestrel-t07",
        &dir.path().join("outer/surveys/old"),
        Some("HIDDEN"),
    );
    let shown = dir.path().display().to_string();
    let fleet = json(&strake(["fleet", &shown, "--format", "json"]));
    let mut ids: Vec<&str> = fleet["tanks"]
        .as_array()
        .expect("tanks")
        .iter()
        .map(|t| t["tank_id"].as_str().expect("id"))
        .collect();
    ids.sort_unstable();
    assert_eq!(ids, ["INNER", "OUTER"]);
}

/// Same input, byte-identical output, whatever the number of worker threads and the
/// order they finish in.
#[test]
fn deterministic_across_runs_and_threads() {
    let dir = tempfile::tempdir().expect("temp dir");
    for i in 0..12 {
        let name = ["kestrel-t12", "kestrel-t03", "kestrel-t07"][i % 3];
        copy_sample(
            name,
            &dir.path().join(format!("t{i:02}")),
            Some(&format!("T{}", 11 - i)),
        );
    }
    let arg = dir.path().to_str().expect("utf-8");
    let run = |threads: &str| {
        let out = assert_cmd::Command::cargo_bin("strake")
            .expect("binary")
            .env("NO_COLOR", "1")
            .env("RAYON_NUM_THREADS", threads)
            .args(["fleet", arg, "--format", "json"])
            .output()
            .expect("runs");
        assert!(out.status.success());
        out.stdout
    };
    let first = run("2");
    assert_eq!(first, run("2"));
    assert_eq!(first, run("1"));
    assert_eq!(first, run("4"));
}

// ---------------------------------------------------------------------------------
// `fleet --out`: the fleet page and each tank's report folder.

/// Every file below `dir`, by path relative to it.
fn tree(dir: &Path) -> std::collections::BTreeMap<String, Vec<u8>> {
    let mut out = std::collections::BTreeMap::new();
    let mut stack = vec![dir.to_path_buf()];
    while let Some(d) = stack.pop() {
        for e in std::fs::read_dir(&d).unwrap_or_else(|e| panic!("{}: {e}", d.display())) {
            let p = e.expect("entry").path();
            if p.is_dir() {
                stack.push(p);
            } else {
                let rel = p.strip_prefix(dir).expect("under").display().to_string();
                out.insert(rel, std::fs::read(&p).expect("read"));
            }
        }
    }
    out
}

/// The tank links of the fleet page's plan table, in table order: (href, tank id as
/// shown).
fn plan_links(html: &str) -> Vec<(String, String)> {
    let table = &html[html.find("<section id=\"plan\">").expect("plan section")..];
    let table = &table[..table.find("</table>").expect("end of table")];
    table
        .split("<td class=\"text tank\"><a href=\"")
        .skip(1)
        .map(|rest| {
            let href = &rest[..rest.find('"').expect("end of href")];
            let id = &rest[rest.find('>').expect("tag end") + 1..rest.find("</a>").expect("a")];
            (href.to_string(), id.to_string())
        })
        .collect()
}

/// Runs `fleet DIR --out OUT` (extra arguments after), expecting `code`.
fn fleet_out(dir: &Path, out: &Path, extra: &[&str], code: i32) -> crate::support::Run {
    let mut args = vec![
        "fleet".to_string(),
        dir.display().to_string(),
        "--out".to_string(),
        out.display().to_string(),
    ];
    args.extend(extra.iter().map(|s| s.to_string()));
    let run = strake(&args);
    assert_eq!(run.code, code, "{}", run.stderr);
    run
}

/// The sample fleet with `--out`: the terminal output is unchanged but for one line on
/// standard error; the fleet page lists every tank in the order of the JSON table
/// (next due date), each linked to its own report folder, whose index.html exists; the
/// two charts are inline (SVG) and beside the page (PNG, decoded with the png crate);
/// no script, nothing fetched, the caution present.
#[test]
fn fleet_page_lists_every_tank_in_due_order_with_working_links() {
    let tmp = tempfile::tempdir().expect("temp");
    let out = tmp.path().join("out");
    let run = fleet_out(Path::new("sample-inspections"), &out, &[], 0);
    let plain = strake(["fleet", "sample-inspections"]);
    assert_eq!(run.stdout, plain.stdout, "terminal output unchanged");
    assert_eq!(
        run.stderr,
        format!(
            "report: {} (the fleet page and 2 PNG charts; 3 tank reports beside it)\n",
            out.join("index.html").display()
        )
    );
    let js = json(&strake(["fleet", "sample-inspections", "--format", "json"]));
    let tanks = js["tanks"].as_array().expect("tanks");
    let html = std::fs::read_to_string(out.join("index.html")).expect("fleet page");
    let links = plan_links(&html);
    let ids: Vec<&str> = links.iter().map(|(_, id)| id.as_str()).collect();
    let json_ids: Vec<&str> = tanks
        .iter()
        .map(|t| t["tank_id"].as_str().expect("id"))
        .collect();
    assert_eq!(ids, json_ids, "the page's order is the planning order");
    assert_eq!(ids, ["KR-T07", "KR-T12", "KR-T03"]);
    let due: Vec<&str> = tanks
        .iter()
        .map(|t| t["next_due"].as_str().expect("due"))
        .collect();
    assert!(due.windows(2).all(|w| w[0] <= w[1]), "{due:?}");
    for d in &due {
        assert!(html.contains(&format!("<b>{d}</b>")), "due date {d} shown");
    }
    for (href, id) in &links {
        assert_eq!(href, &format!("{id}/index.html"));
        let target = out.join(href);
        assert!(target.is_file(), "{href} resolves to {}", target.display());
        let report = std::fs::read_to_string(&target).expect("tank report");
        assert!(report.contains(&format!("<title>Shell assessment {id} as of")));
    }
    for (id, file) in [
        ("chart-due", "inspections-due-by-month.png"),
        ("chart-life", "remaining-life.png"),
    ] {
        assert_eq!(
            html.matches(&format!("<svg id=\"{id}\"")).count(),
            1,
            "{id}"
        );
        assert!(html.contains(&format!("<a href=\"{file}\">PNG copy</a>")));
        let bytes = std::fs::read(out.join(file)).expect("png");
        let decoder = png::Decoder::new(std::io::Cursor::new(bytes));
        let reader = decoder.read_info().expect("a PNG");
        assert_eq!(reader.info().width, 1800, "{file}");
    }
    assert!(!html.to_ascii_lowercase().contains("<script"));
    assert_eq!(
        html.matches("http").count(),
        html.matches("xmlns=\"http://www.w3.org/2000/svg\"").count(),
        "no address other than the SVG namespace"
    );
    assert!(html.contains("Screening aid only."), "the caution");
    assert!(html.contains("@media print"), "a print stylesheet");
    // The inspections counted by the due-date chart: each tank's next UT and next
    // external inspection, six in all (the JSON's dates).
    assert!(html.contains("6 inspections from 2028-08 to 2040-10"));
    // Exactly the fleet page's files and one folder per tank.
    let mut names: Vec<String> = std::fs::read_dir(&out)
        .expect("out")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(
        names,
        [
            "KR-T03",
            "KR-T07",
            "KR-T12",
            "index.html",
            "inspections-due-by-month.png",
            "remaining-life.png"
        ]
    );
}

/// Each tank's folder holds the same bytes as `assess TANK --out` writes, and the
/// JSON table is the same with and without `--out` (the reports need per-point
/// results, which change no fleet value).
#[test]
fn tank_reports_are_the_assess_reports() {
    let tmp = tempfile::tempdir().expect("temp");
    let out = tmp.path().join("out");
    let with = fleet_out(
        Path::new("sample-inspections"),
        &out,
        &["--format", "json"],
        0,
    );
    let without = strake(["fleet", "sample-inspections", "--format", "json"]);
    assert_eq!(with.stdout, without.stdout);
    for (sample, id) in [
        ("kestrel-t12", "KR-T12"),
        ("kestrel-t03", "KR-T03"),
        ("kestrel-t07", "KR-T07"),
    ] {
        let alone = tmp.path().join(id);
        let run = strake([
            "assess",
            &format!("sample-inspections/{sample}"),
            "--out",
            alone.to_str().expect("utf-8"),
        ]);
        assert_eq!(run.code, 0, "{}", run.stderr);
        let fleet_report = tree(&out.join(id));
        assert_eq!(fleet_report.len(), report_file_count(id), "{id}");
        assert_eq!(fleet_report, tree(&alone), "{id}");
    }
}

/// The same fleet gives the same bytes in every file of the folder, with 1 and 4
/// worker threads (so whatever order the workers finish in), and over an existing
/// folder (no temporary file left behind).
#[test]
fn fleet_out_is_byte_identical_run_to_run() {
    let tmp = tempfile::tempdir().expect("temp");
    let fleet = tmp.path().join("fleet");
    for i in 0..5 {
        let name = ["kestrel-t12", "kestrel-t03", "kestrel-t07"][i % 3];
        copy_sample(
            name,
            &fleet.join(format!("t{i}")),
            Some(&format!("T{}", 4 - i)),
        );
    }
    let run = |out: &Path, threads: &str| {
        let o = assert_cmd::Command::cargo_bin("strake")
            .expect("binary")
            .env("NO_COLOR", "1")
            .env("RAYON_NUM_THREADS", threads)
            .args(["fleet", fleet.to_str().expect("utf-8"), "--out"])
            .arg(out)
            .output()
            .expect("runs");
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    };
    let (a, b) = (tmp.path().join("a"), tmp.path().join("b"));
    run(&a, "1");
    run(&b, "4");
    let first = tree(&a);
    for name in [
        "index.html",
        "inspections-due-by-month.png",
        "remaining-life.png",
    ]
    .into_iter()
    .map(String::from)
    .chain((0..5).map(|i| format!("T{i}/index.html")))
    {
        assert!(
            first.keys().any(|k| *k == name),
            "{name} missing: {:?}",
            first.keys()
        );
    }
    assert_eq!(first, tree(&b));
    run(&a, "2");
    assert_eq!(
        first,
        tree(&a),
        "rerun over the folder: same files, same bytes"
    );
}

/// A broken folder is listed on the page with its whole error line (escaped) and gets
/// no report; the other tanks are linked; the exit code is 1.
#[test]
fn broken_folder_is_listed_on_the_page() {
    let dir = tempfile::tempdir().expect("temp dir");
    let fleet = dir.path().join("fleet");
    copy_sample("kestrel-t07", &fleet.join("t07"), None);
    let target = fleet.join("t99");
    std::fs::create_dir_all(target.join("surveys")).expect("mkdir");
    std::fs::write(target.join("tank.toml"), SMALL_SI_TANK).expect("tank.toml");
    std::fs::write(
        target.join("surveys/a.csv"),
        "date,course,thickness\n2024-01-01,1,9.0\n2024-01-01,<x>,9.0\n",
    )
    .expect("survey");
    let out = dir.path().join("out");
    let run = fleet_out(&fleet, &out, &[], 1);
    let file = target.join("surveys/a.csv").display().to_string();
    let message = format!(
        "{file}:3: column \"course\": \"<x>\" is not a course number (expected a whole \
         number, 1 = bottom course)"
    );
    assert!(
        run.stderr.starts_with(&format!("error: {message}\n")),
        "{}",
        run.stderr
    );
    let html = std::fs::read_to_string(out.join("index.html")).expect("page");
    let section = &html[html.find("<section id=\"not-assessed\">").expect("listed")..];
    let escaped = message
        .replace('&', "&amp;")
        .replace('<', "&lt;")
        .replace('>', "&gt;")
        .replace('"', "&quot;");
    assert!(section.contains(&escaped), "{section}");
    assert!(html.contains("Folders not assessed (1)"));
    assert!(!out.join("FX-1").exists(), "no report for a broken tank");
    let links = plan_links(&html);
    assert_eq!(links.len(), 1);
    assert!(out.join(&links[0].0).is_file());
}

/// Tank text is escaped on the page and in its charts: an id and a name that are
/// markup never become elements; the id's report folder is a safe name the link finds.
/// Two tanks with the same id get two folders, `-2` for the second in folder order.
#[test]
fn markup_ids_are_escaped_and_repeated_ids_get_their_own_folder() {
    let dir = tempfile::tempdir().expect("temp dir");
    let fleet = dir.path().join("fleet");
    copy_sample(
        "kestrel-t07",
        &fleet.join("a"),
        Some("<script>alert(1)</script>"),
    );
    copy_sample("kestrel-t12", &fleet.join("b"), Some("KR-T12"));
    copy_sample("kestrel-t12", &fleet.join("c"), Some("KR-T12"));
    let toml_path = fleet.join("a/tank.toml");
    let toml = std::fs::read_to_string(&toml_path).expect("toml");
    let old = toml
        .lines()
        .find(|l| l.starts_with("name = "))
        .expect("name line")
        .to_string();
    std::fs::write(
        &toml_path,
        toml.replace(&old, "name = \"<b>bold</b> & co\""),
    )
    .expect("write");
    let out = dir.path().join("out");
    fleet_out(&fleet, &out, &[], 0);
    let html = std::fs::read_to_string(out.join("index.html")).expect("page");
    assert!(
        !html.to_ascii_lowercase().contains("<script"),
        "no script element"
    );
    assert!(!html.contains("<b>bold</b>"));
    assert!(
        html.contains("&lt;script&gt;alert(1)&lt;/script&gt;"),
        "id as text"
    );
    assert!(
        html.contains("&lt;b&gt;bold&lt;/b&gt; &amp; co"),
        "name as text"
    );
    let links = plan_links(&html);
    let hrefs: Vec<&str> = links.iter().map(|(h, _)| h.as_str()).collect();
    assert_eq!(
        hrefs,
        [
            "_script_alert_1___script_/index.html",
            "KR-T12/index.html",
            "KR-T12-2/index.html"
        ]
    );
    for (href, _) in &links {
        assert!(out.join(href).is_file(), "{href}");
    }
    // The two KR-T12 reports come from the two folders, in folder order.
    let page = |h: &str| std::fs::read_to_string(out.join(h)).expect("report");
    assert!(page("KR-T12/index.html").contains(&format!("{}", fleet.join("b").display())));
    assert!(page("KR-T12-2/index.html").contains(&format!("{}", fleet.join("c").display())));
}

/// `--out` without a value writes to reports/fleet/ under the working folder.
#[test]
fn default_fleet_folder() {
    let outer = tempfile::tempdir().expect("temp");
    let samples = crate::support::root().join("sample-inspections");
    let run = crate::support::strake_at(
        outer.path(),
        ["fleet", samples.to_str().expect("utf-8"), "--out"],
    );
    assert_eq!(run.code, 0, "{}", run.stderr);
    assert_eq!(
        run.stderr,
        "report: reports/fleet/index.html (the fleet page and 2 PNG charts; 3 tank reports \
         beside it)\n"
    );
    assert!(
        outer
            .path()
            .join("reports/fleet/KR-T12/index.html")
            .is_file()
    );
}

/// The fleet folder is never put inside a tank's surveys/ (or scans/) folder, where
/// its files would be taken for inputs; nothing is written.
#[test]
fn fleet_folder_is_not_written_into_inputs() {
    let dir = tempfile::tempdir().expect("temp dir");
    let fleet = dir.path().join("fleet");
    copy_sample("kestrel-t07", &fleet.join("t07"), None);
    let surveys = fleet.join("t07/surveys");
    let out = surveys.join("plan");
    let run = fleet_out(&fleet, &out, &[], 1);
    assert_eq!(
        run.stderr,
        format!(
            "error: {}: the fleet report folder must not be inside a tank's input folder {} \
             (its files would be read as inputs, or reported as files not read); choose \
             another folder with --out DIR\n",
            out.display(),
            surveys.display()
        )
    );
    assert!(!out.exists());
}

/// Files in a sample tank's committed report folder (reports/<id>/): the same set
/// `assess --out` writes for it (tests/it/report.rs keeps them current).
fn report_file_count(id: &str) -> usize {
    std::fs::read_dir(crate::support::root().join("reports").join(id))
        .expect("committed report")
        .count()
}
