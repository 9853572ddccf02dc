//! The raw floor of the benchmark (benches/run.sh): reads every survey CSV file below a
//! folder with the csv crate's `ByteRecord` loop and nothing else (no field is looked
//! at), on the same number of threads as `strake fleet` (rayon), and prints the count.
//!
//! Usage: cargo bench --bench csv_floor -- DIR

use std::path::PathBuf;

use rayon::prelude::*;

fn main() -> Result<(), Box<dyn std::error::Error>> {
    let dir = std::env::args()
        .nth(1)
        .filter(|a| a != "--bench")
        .ok_or("usage: csv_floor DIR")?;
    let start = std::time::Instant::now();
    let mut files: Vec<PathBuf> = walkdir::WalkDir::new(dir)
        .into_iter()
        .filter_map(Result::ok)
        .filter(|e| e.file_type().is_file() && e.path().extension().is_some_and(|x| x == "csv"))
        .map(walkdir::DirEntry::into_path)
        .collect();
    files.sort();
    let rows: usize = files
        .par_iter()
        .map(|path| -> Result<usize, csv::Error> {
            let mut reader = csv::Reader::from_path(path)?;
            let mut record = csv::ByteRecord::new();
            let mut n = 0;
            while reader.read_byte_record(&mut record)? {
                n += 1;
            }
            Ok(n)
        })
        .collect::<Result<Vec<_>, _>>()?
        .into_iter()
        .sum();
    println!(
        "{} files, {rows} rows in {:.3} s",
        files.len(),
        start.elapsed().as_secs_f64()
    );
    Ok(())
}
