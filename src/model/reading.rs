//! Thickness readings as read from survey files.

use chrono::NaiveDate;

use crate::calc::units::{Length, Thickness};
use crate::model::scan::Scan;

/// Where a reading came from: an index into the list of files read, and the 1-based
/// line of the row.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct Origin {
    /// Index into [`ReadingSet::files`].
    pub file: u32,
    /// 1-based line number of the row.
    pub line: u64,
}

/// One ultrasonic thickness reading.
#[derive(Debug, Clone, PartialEq)]
pub struct Reading {
    /// Survey date.
    pub date: NaiveDate,
    /// Course number, 1 = bottom.
    pub course: u32,
    /// Measured wall thickness, in the tank's thickness unit.
    pub thickness: Thickness,
    /// Stable location id, re-measured at every survey.
    pub point: Option<Box<str>>,
    /// Height above the tank bottom, in the tank's length unit.
    pub elevation: Option<Length>,
    /// Degrees clockwise from the tank's 0 mark.
    pub azimuth: Option<f64>,
    /// Free text.
    pub note: Option<Box<str>>,
    /// File and line.
    pub origin: Origin,
}

/// Every reading of a tank, with the files they came from.
#[derive(Debug, Clone, Default, PartialEq)]
pub struct ReadingSet {
    /// Files read, as displayed in messages (the path as the user gave it).
    pub files: Vec<String>,
    /// Readings in file order, then line order.
    pub readings: Vec<Reading>,
    /// Grid scans of local thin areas (`scans/*.csv`), in file-name order.
    pub scans: Vec<Scan>,
}

impl Reading {
    /// The reading as it would stream past, with its point id keyed by `names`.
    pub fn borrow<'a>(&'a self, names: &mut PointNames) -> ReadingRef<'a> {
        ReadingRef {
            date: self.date,
            course: self.course,
            thickness: self.thickness,
            point: self.point.as_deref().map(|id| PointRef {
                key: names.key(id),
                id,
            }),
            elevation: self.elevation,
            azimuth: self.azimuth,
            note: self.note.as_deref(),
            origin: self.origin,
        }
    }
}

impl ReadingSet {
    /// Display name of the file a reading came from.
    pub fn file_of(&self, origin: Origin) -> &str {
        self.files
            .get(origin.file as usize)
            .map(String::as_str)
            .unwrap_or("?")
    }
    /// `file:line` of a reading.
    pub fn locate(&self, origin: Origin) -> String {
        format!("{}:{}", self.file_of(origin), origin.line)
    }
}

/// A stable key for a point id within one tank: the same id text always gets the same
/// key while a tank's survey files are read (see [`PointNames`]).
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub struct PointKey(pub u32);

/// A point id as it streams past: its key and its text.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct PointRef<'a> {
    /// Key, the same for the same text within one tank.
    pub key: PointKey,
    /// The id as written.
    pub id: &'a str,
}

/// One reading as the survey reader hands it on while parsing: the text of its point
/// and note is borrowed from the row, so nothing is allocated per reading.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ReadingRef<'a> {
    /// Survey date.
    pub date: NaiveDate,
    /// Course number, 1 = bottom.
    pub course: u32,
    /// Measured wall thickness, in the tank's thickness unit.
    pub thickness: Thickness,
    /// Stable location id.
    pub point: Option<PointRef<'a>>,
    /// Height above the tank bottom, in the tank's length unit.
    pub elevation: Option<Length>,
    /// Degrees clockwise from the tank's 0 mark.
    pub azimuth: Option<f64>,
    /// Free text.
    pub note: Option<&'a str>,
    /// File and line.
    pub origin: Origin,
}

impl ReadingRef<'_> {
    /// An owned copy.
    pub fn to_reading(&self) -> Reading {
        Reading {
            date: self.date,
            course: self.course,
            thickness: self.thickness,
            point: self.point.map(|p| Box::from(p.id)),
            elevation: self.elevation,
            azimuth: self.azimuth,
            note: self.note.map(Box::from),
            origin: self.origin,
        }
    }
}

/// Whatever consumes readings as they are parsed (an accumulator of what the methods
/// need, a screening count, or a plain collection).
pub trait ReadingSink {
    /// Takes one reading. Readings arrive in file order, then line order.
    fn accept(&mut self, reading: &ReadingRef<'_>);
}

impl ReadingSink for Vec<Reading> {
    fn accept(&mut self, reading: &ReadingRef<'_>) {
        self.push(reading.to_reading());
    }
}

/// Interns the point ids of one tank: each distinct id text gets a [`PointKey`], in
/// order of first appearance.
///
/// Survey files of one tank usually list the same points in the same order, so the
/// key after the previous one is tried first (a comparison of a few bytes) before
/// the hash map is asked.
///
/// An id can also be given as raw bytes ([`PointNames::key_of_bytes`]): bytes equal to
/// an id already known need no UTF-8 check, since that id's text was checked when it
/// was first seen; only a new id is checked.
///
/// Each id is kept once, as its key's text; the map goes from the hash of an id's
/// bytes to the last key with that hash (keys sharing a hash are chained, and
/// compared byte for byte).
#[derive(Debug, Clone, Default)]
pub struct PointNames {
    /// Hash of an id's bytes -> the last key given an id with that hash.
    by_hash: rustc_hash::FxHashMap<u64, u32>,
    /// Per key: the key given before it with the same hash, or [`NO_KEY`].
    same_hash: Vec<u32>,
    /// Per key: its id.
    ids: Vec<Box<str>>,
    /// The key after the one last asked for: the first guess for the next id.
    next: usize,
}

/// No key (the end of a hash chain).
const NO_KEY: u32 = u32::MAX;

/// `a == b`, for the short texts of point ids without a call to the C library: 4 to
/// 16 bytes as two (overlapping) words of 4 or 8 bytes, fewer byte by byte.
#[inline(always)]
pub fn same_bytes(a: &[u8], b: &[u8]) -> bool {
    if a.len() != b.len() {
        return false;
    }
    match a.len() {
        8..=16 => a.first_chunk::<8>() == b.first_chunk() && a.last_chunk::<8>() == b.last_chunk(),
        4..=7 => a.first_chunk::<4>() == b.first_chunk() && a.last_chunk::<4>() == b.last_chunk(),
        0..=3 => a.iter().zip(b).all(|(x, y)| x == y),
        _ => a == b,
    }
}

/// The hash of an id's bytes.
fn id_hash(id: &[u8]) -> u64 {
    use std::hash::BuildHasher;
    rustc_hash::FxBuildHasher.hash_one(id)
}

/// Room made at once for the points of a tank, in the interner and in whatever keeps
/// something per point: a tank's survey has a few hundred points (common practice),
/// and growing step by step costs more than the room.
pub const POINT_ROOM: usize = 512;

impl PointNames {
    /// The key of `id`, assigning the next one on first sight.
    pub fn key(&mut self, id: &str) -> PointKey {
        match self.find(id.as_bytes()) {
            Ok(k) => PointKey(k as u32),
            Err(hash) => self.insert(id, hash),
        }
    }
    /// The key of the id whose bytes are `id`, assigning the next one on first sight;
    /// an error when `id` is new and not UTF-8 (nothing is assigned then).
    #[inline]
    pub fn key_of_bytes(&mut self, id: &[u8]) -> Result<PointKey, std::str::Utf8Error> {
        match self.find(id) {
            Ok(k) => Ok(PointKey(k as u32)),
            Err(hash) => Ok(self.insert(std::str::from_utf8(id)?, hash)),
        }
    }
    /// The key of a known id: the one after the previous key first, then the map.
    /// For an id not known, the hash of its bytes.
    #[inline]
    fn find(&mut self, id: &[u8]) -> Result<usize, u64> {
        let guess = self.next;
        let key = match self.ids.get(guess) {
            Some(name) if same_bytes(name.as_bytes(), id) => guess,
            _ => self.look_up(id)?,
        };
        self.next = key + 1;
        Ok(key)
    }
    /// The key of a known id, from the map; the hash of its bytes when it is not
    /// known.
    fn look_up(&self, id: &[u8]) -> Result<usize, u64> {
        let hash = id_hash(id);
        let mut k = match self.by_hash.get(&hash) {
            Some(&k) => k as usize,
            None => return Err(hash),
        };
        loop {
            match self.bytes(k) {
                Some(name) if name == id => return Ok(k),
                Some(_) => {}
                None => return Err(hash),
            }
            k = match self.same_hash.get(k) {
                Some(&before) => before as usize,
                None => return Err(hash),
            };
        }
    }
    /// A new id's key; `hash` is the hash of its bytes.
    fn insert(&mut self, id: &str, hash: u64) -> PointKey {
        let k = self.ids.len();
        if k == 0 {
            self.ids.reserve(POINT_ROOM);
            self.same_hash.reserve(POINT_ROOM);
            self.by_hash.reserve(POINT_ROOM);
        }
        self.ids.push(Box::from(id));
        let before = self.by_hash.insert(hash, k as u32);
        self.same_hash.push(before.unwrap_or(NO_KEY));
        self.next = k + 1;
        PointKey(k as u32)
    }
    /// The bytes of id `k`.
    #[inline]
    fn bytes(&self, k: usize) -> Option<&[u8]> {
        Some(self.ids.get(k)?.as_bytes())
    }
    /// The text of a key given out by this interner.
    #[inline]
    pub fn name(&self, key: PointKey) -> Option<&str> {
        self.ids.get(key.0 as usize).map(|id| &**id)
    }
    /// Number of distinct ids seen.
    pub fn len(&self) -> usize {
        self.ids.len()
    }
    /// True when no id has been seen.
    pub fn is_empty(&self) -> bool {
        self.ids.is_empty()
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn interning_gives_stable_keys_in_order_of_first_sight() {
        let mut n = PointNames::default();
        let first: Vec<u32> = ["A", "B", "C"].iter().map(|s| n.key(s).0).collect();
        assert_eq!(first, [0, 1, 2]);
        // The same ids again, in order (the guessed path) and out of order (the map).
        let again: Vec<u32> = ["A", "B", "C", "B", "A", "D", "C"]
            .iter()
            .map(|s| n.key(s).0)
            .collect();
        assert_eq!(again, [0, 1, 2, 1, 0, 3, 2]);
        assert_eq!(n.name(PointKey(3)), Some("D"));
        assert_eq!(n.len(), 4);
        // Bytes: a known id by its bytes, a new one checked, a bad one refused and
        // given no key.
        assert_eq!(n.key_of_bytes(b"B"), Ok(PointKey(1)));
        assert_eq!(n.key_of_bytes("É".as_bytes()), Ok(PointKey(4)));
        assert!(n.key_of_bytes(b"\xC3").is_err());
        assert_eq!(n.len(), 5);
        assert_eq!(n.key("F"), PointKey(5));
    }

    /// The short comparison is `==` (the reference), for every length up to 20 and a
    /// difference at every position.
    #[test]
    fn same_bytes_is_equality() {
        for n in 0..=20usize {
            let a: Vec<u8> = (0..n as u8).map(|i| b'A' + i).collect();
            assert!(same_bytes(&a, &a.clone()));
            for k in 0..n {
                let mut b = a.clone();
                b[k] ^= 1;
                assert!(!same_bytes(&a, &b), "{n} {k}");
            }
            assert!(!same_bytes(&a, &a[..n.saturating_sub(1)]) || n == 0);
        }
    }

    /// Many ids, asked for out of order: each keeps its key and its text (the map path,
    /// not the guess of the next key).
    #[test]
    fn many_ids_keep_their_keys() {
        let mut n = PointNames::default();
        let ids: Vec<String> = (0..5000)
            .map(|i| format!("D{}-C{}-{i}", i % 8, i % 6))
            .collect();
        for (k, id) in ids.iter().enumerate() {
            assert_eq!(n.key(id), PointKey(k as u32));
        }
        for (k, id) in ids.iter().enumerate().rev().step_by(7) {
            assert_eq!(n.key_of_bytes(id.as_bytes()), Ok(PointKey(k as u32)));
            assert_eq!(n.name(PointKey(k as u32)), Some(id.as_str()));
        }
        assert_eq!(n.len(), ids.len());
    }
}
