//! Survey records straight from csv-core, the csv crate's own parser: the crate's
//! record layer (its `ByteRecord` and buffered reader) does the same for any file, at
//! a cost of its own per row (7 to 9 % of the time of the csv crate's plain loop over
//! a survey file, in the profile of the benchmark's floor).
//!
//! Nothing here splits CSV: csv-core does, into a record's field bytes and field ends,
//! exactly as the csv crate would with the same settings. This only gives it the file
//! a buffer at a time, makes room when a record outgrows its buffers, and keeps the
//! line a record starts on as the csv crate counts it (the parser's line count before
//! the record is read). It also checks that the bytes are UTF-8 as they arrive.

use std::io::Read;

use csv_core::ReadRecordResult;

/// Bytes asked of the file at a time.
const READ_BUFFER: usize = 64 * 1024;

/// One record: the bytes of its fields one after another, where each field ends, and
/// the line the record starts on.
#[derive(Debug, Clone)]
pub struct Record {
    bytes: Vec<u8>,
    ends: Vec<usize>,
    len: usize,
    line: u64,
}

impl Default for Record {
    fn default() -> Self {
        // (Room for a usual survey row at once: common practice sizes, grown on need.)
        Record {
            bytes: vec![0; 256],
            ends: vec![0; 16],
            len: 0,
            line: 1,
        }
    }
}

impl Record {
    /// A record of these fields.
    #[cfg(test)]
    pub fn from_fields<T: AsRef<[u8]>>(fields: &[T]) -> Self {
        let mut bytes = Vec::new();
        let mut ends = Vec::new();
        for f in fields {
            bytes.extend_from_slice(f.as_ref());
            ends.push(bytes.len());
        }
        Record {
            len: ends.len(),
            bytes,
            ends,
            line: 1,
        }
    }

    /// Number of fields.
    #[inline(always)]
    pub fn len(&self) -> usize {
        self.len
    }

    /// The line the record starts on (1-based, as the csv crate counts it).
    #[inline(always)]
    pub fn line(&self) -> u64 {
        self.line
    }

    /// Field `i`, untrimmed.
    #[inline]
    pub fn get(&self, i: usize) -> Option<&[u8]> {
        if i >= self.len {
            return None;
        }
        let start = if i == 0 { 0 } else { self.ends[i - 1] };
        self.bytes.get(start..self.ends[i])
    }

    /// The fields in order.
    #[inline(always)]
    pub fn iter(&self) -> impl Iterator<Item = &[u8]> {
        let mut start = 0;
        self.ends[..self.len].iter().map(move |&end| {
            let field = &self.bytes[start..end];
            start = end;
            field
        })
    }

    /// Every field's bytes one after another, and where each field ends in them.
    #[inline(always)]
    pub fn parts(&self) -> (&[u8], &[usize]) {
        (&self.bytes, &self.ends[..self.len])
    }

    /// Every field's bytes one after another.
    #[inline(always)]
    pub fn as_slice(&self) -> &[u8] {
        match self.len {
            0 => &[],
            n => &self.bytes[..self.ends[n - 1]],
        }
    }

    /// A copy with one more field at the end.
    #[cfg(test)]
    pub fn with_field(&self, field: &[u8]) -> Self {
        let mut fields: Vec<Vec<u8>> = self.iter().map(<[u8]>::to_vec).collect();
        fields.push(field.to_vec());
        Record::from_fields(&fields)
    }
}

/// Where the first byte that is not UTF-8 sits in a file.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct BadByte {
    /// 1-based line.
    pub line: u64,
    /// 1-based column, in characters.
    pub column: u64,
    /// The byte.
    pub byte: u8,
}

impl std::fmt::Display for BadByte {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(
            f,
            "byte 0x{:02X} at {}:{} is not UTF-8",
            self.byte, self.line, self.column
        )
    }
}

impl std::error::Error for BadByte {}

/// The bad byte behind a read error, if that is what it is.
pub fn bad_byte_of(e: &std::io::Error) -> Option<BadByte> {
    e.get_ref()?.downcast_ref::<BadByte>().copied()
}

/// Checks that a file's bytes are UTF-8 as they are read, so that a bad byte anywhere
/// in a file (a comment line included) is refused with its line and column. Per
/// stretch of bytes: one validation (simdutf8, many bytes at a time; the standard
/// library's only to locate a bad byte), one newline count (memchr) and a character
/// count of the text after the last newline; a character split between two reads is
/// carried over.
#[derive(Debug)]
struct Utf8Check {
    /// Bytes of a character begun at the end of the last stretch.
    pending: Vec<u8>,
    /// Line of the next byte (1-based).
    line: u64,
    /// Characters since the last newline.
    column: u64,
}

impl Utf8Check {
    fn new() -> Self {
        Utf8Check {
            pending: Vec::new(),
            line: 1,
            column: 0,
        }
    }

    /// Checks the next stretch of the file.
    fn see(&mut self, bytes: &[u8]) -> std::io::Result<()> {
        let joined;
        let data: &[u8] = if self.pending.is_empty() {
            bytes
        } else {
            let mut v = std::mem::take(&mut self.pending);
            v.extend_from_slice(bytes);
            joined = v;
            &joined
        };
        if simdutf8::basic::from_utf8(data).is_ok() {
            self.advance(data);
            return Ok(());
        }
        match std::str::from_utf8(data) {
            Ok(_) => self.advance(data),
            Err(e) => {
                let (valid, rest) = data.split_at(e.valid_up_to());
                self.advance(valid);
                if e.error_len().is_some() {
                    return Err(self.bad(rest[0]));
                }
                // A character begun at the end of the stretch: finished by the next.
                self.pending = rest.to_vec();
            }
        }
        Ok(())
    }

    /// The file has ended: a character begun and not finished is a bad byte.
    fn end(&self) -> std::io::Result<()> {
        match self.pending.first() {
            Some(&b) => Err(self.bad(b)),
            None => Ok(()),
        }
    }

    /// Counts lines and columns over valid text.
    fn advance(&mut self, text: &[u8]) {
        let newlines = memchr::memchr_iter(b'\n', text).count() as u64;
        let tail = match memchr::memrchr(b'\n', text) {
            Some(i) => {
                self.line += newlines;
                self.column = 0;
                &text[i + 1..]
            }
            None => text,
        };
        self.column += tail.iter().filter(|&&b| (b & 0xC0) != 0x80).count() as u64;
    }

    fn bad(&self, byte: u8) -> std::io::Error {
        std::io::Error::new(
            std::io::ErrorKind::InvalidData,
            BadByte {
                line: self.line,
                column: self.column + 1,
                byte,
            },
        )
    }
}

/// The UTF-8 byte-order mark some spreadsheet programs write.
pub const BOM: &[u8] = b"\xEF\xBB\xBF";

/// The records of one file after another: one buffer the file is read into, checked
/// for UTF-8 as it arrives, and one csv-core parser per delimiter (building one
/// compiles its tables, which costs more than reading a survey file of a few hundred
/// rows; a fleet reads thousands of files).
pub struct Records {
    parsers: Vec<(u8, csv_core::Reader)>,
    /// The parser of the file being read.
    current: usize,
    source: Box<dyn Read>,
    utf8: Utf8Check,
    buffer: Vec<u8>,
    /// Bytes of `buffer` not handed to the parser yet start here...
    start: usize,
    /// ...those checked for UTF-8 end here...
    checked: usize,
    /// ...and those read end here.
    end: usize,
    /// The parser has said the file is over.
    done: bool,
}

impl Default for Records {
    fn default() -> Self {
        Records {
            parsers: Vec::new(),
            current: 0,
            source: Box::new(std::io::empty()),
            utf8: Utf8Check::new(),
            buffer: vec![0; READ_BUFFER],
            start: 0,
            checked: 0,
            end: 0,
            done: true,
        }
    }
}

impl Records {
    /// Starts reading `source`: reads it until its first line that is neither blank
    /// nor a comment is in (or the file ends), leaves out a byte-order mark, and
    /// returns the bytes up to the end of that line (checked for UTF-8: the rest is
    /// checked as the records need it), for the caller to choose the delimiter from.
    /// Then [`Self::records`] with that delimiter.
    pub fn open(&mut self, source: Box<dyn Read>) -> std::io::Result<&[u8]> {
        self.source = source;
        self.utf8 = Utf8Check::new();
        self.start = 0;
        self.checked = 0;
        self.end = 0;
        self.done = false;
        let head = loop {
            match first_line_end(&self.buffer[..self.end]) {
                Some(head) => break head,
                None => {
                    if self.end == self.buffer.len() {
                        grow(&mut self.buffer);
                    }
                    let n = read_some(&mut *self.source, &mut self.buffer[self.end..])?;
                    if n == 0 {
                        break self.end;
                    }
                    self.end += n;
                }
            }
        };
        if self.buffer[..self.end].starts_with(BOM) {
            self.start = BOM.len();
        }
        let head = head.max(self.start);
        self.utf8.see(&self.buffer[self.start..head])?;
        self.checked = head;
        Ok(&self.buffer[self.start..head])
    }

    /// Reads the records of the file opened with `delimiter` between fields, `#`
    /// starting a comment line, quotes as the csv crate reads them by default.
    pub fn records(&mut self, delimiter: u8) {
        self.current = match self.parsers.iter().position(|(d, _)| *d == delimiter) {
            Some(i) => i,
            None => {
                let parser = csv_core::ReaderBuilder::new()
                    .delimiter(delimiter)
                    .comment(Some(b'#'))
                    .build();
                self.parsers.push((delimiter, parser));
                self.parsers.len() - 1
            }
        };
        self.parsers[self.current].1.reset();
    }

    /// Lets go of the source (the file is closed), keeping the parsers and buffer.
    pub fn release(&mut self) {
        self.source = Box::new(std::io::empty());
    }

    /// The next record into `record`, or false at the end of the file.
    #[inline(always)]
    pub fn read(&mut self, record: &mut Record) -> std::io::Result<bool> {
        let Some((_, core)) = self.parsers.get_mut(self.current) else {
            return Ok(false);
        };
        record.len = 0;
        record.line = core.line();
        if self.done {
            return Ok(false);
        }
        let (mut out, mut ends) = (0, 0);
        loop {
            if self.start == self.checked {
                self.more()?;
            }
            let (result, nin, nout, nend) = self.parsers[self.current].1.read_record(
                &self.buffer[self.start..self.checked],
                &mut record.bytes[out..],
                &mut record.ends[ends..],
            );
            self.start += nin;
            out += nout;
            ends += nend;
            match result {
                ReadRecordResult::Record => {
                    record.len = ends;
                    return Ok(true);
                }
                ReadRecordResult::InputEmpty => {}
                ReadRecordResult::OutputFull => grow(&mut record.bytes),
                ReadRecordResult::OutputEndsFull => grow(&mut record.ends),
                ReadRecordResult::End => {
                    self.done = true;
                    return Ok(false);
                }
            }
        }
    }

    /// More bytes for the parser: the ones read and not yet checked, or the next
    /// read of the file (none at its end), checked.
    #[inline(never)]
    fn more(&mut self) -> std::io::Result<()> {
        if self.checked == self.end {
            self.start = 0;
            self.checked = 0;
            self.end = read_some(&mut *self.source, &mut self.buffer)?;
            if self.end == 0 {
                return self.utf8.end();
            }
        }
        self.utf8.see(&self.buffer[self.checked..self.end])?;
        self.checked = self.end;
        Ok(())
    }
}

/// One read, again when interrupted.
fn read_some(source: &mut dyn Read, buffer: &mut [u8]) -> std::io::Result<usize> {
    loop {
        match source.read(buffer) {
            Err(e) if e.kind() == std::io::ErrorKind::Interrupted => {}
            r => return r,
        }
    }
}

/// Where the first line of `bytes` that is neither blank nor a comment ends (after
/// its line feed); None when no such line is complete yet. A byte-order mark at the
/// start is not part of the line.
fn first_line_end(bytes: &[u8]) -> Option<usize> {
    let body = bytes.strip_prefix(BOM).unwrap_or(bytes);
    let offset = bytes.len() - body.len();
    let mut at = 0;
    for i in memchr::memchr_iter(b'\n', body) {
        let line = &body[at..i];
        let line = line.strip_suffix(b"\r").unwrap_or(line);
        if !line.iter().all(u8::is_ascii_whitespace) && !line.starts_with(b"#") {
            return Some(offset + i + 1);
        }
        at = i + 1;
    }
    None
}

/// Twice the room.
#[cold]
#[inline(never)]
fn grow<T: Default + Clone>(v: &mut Vec<T>) {
    let n = v.len().max(4) * 2;
    v.resize(n, T::default());
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A record's line and fields.
    type Lined = (u64, Vec<Vec<u8>>);

    /// Every record of `text` as the csv crate reads it (the reference: the same
    /// parser behind its own record layer) and as [`Records`] does, with a buffer
    /// of `chunk` bytes a read.
    fn both(text: &[u8], delimiter: u8, chunk: usize) -> (Vec<Lined>, Vec<Lined>) {
        let mut reference = Vec::new();
        let mut reader = csv::ReaderBuilder::new()
            .has_headers(false)
            .flexible(true)
            .delimiter(delimiter)
            .comment(Some(b'#'))
            .from_reader(text);
        let mut r = csv::ByteRecord::new();
        while reader.read_byte_record(&mut r).unwrap() {
            let line = r.position().unwrap().line();
            reference.push((line, r.iter().map(<[u8]>::to_vec).collect()));
        }
        /// Hands out at most `chunk` bytes a read.
        struct Trickle(Vec<u8>, usize, usize);
        impl Read for Trickle {
            fn read(&mut self, buf: &mut [u8]) -> std::io::Result<usize> {
                let n = self.2.min(buf.len()).min(self.0.len() - self.1);
                buf[..n].copy_from_slice(&self.0[self.1..self.1 + n]);
                self.1 += n;
                Ok(n)
            }
        }
        let mut ours = Vec::new();
        let mut records = Records::default();
        // (Used once for other text first: the next file must not see it.)
        records
            .open(Box::new(std::io::Cursor::new(b"x\n\"open,\n".to_vec())))
            .unwrap();
        records.records(delimiter);
        let mut rec = Record::default();
        while records.read(&mut rec).unwrap() {}
        records
            .open(Box::new(Trickle(text.to_vec(), 0, chunk)))
            .unwrap();
        records.records(delimiter);
        while records.read(&mut rec).unwrap() {
            ours.push((rec.line(), rec.iter().map(<[u8]>::to_vec).collect()));
        }
        (reference, ours)
    }

    #[test]
    fn records_as_the_csv_crate_reads_them() {
        let long = "x".repeat(1000);
        let many = vec!["7"; 40].join(",");
        let texts: Vec<String> = vec![
            "a,b,c\n1,2,3\n".into(),
            "a,b\r\n\r\n# note\n\"q,\"\"x\"\"\",2\n3,\"multi\nline\"\n4".into(),
            format!("h\n{long},{long}\n{many}\n,,\n"),
            "a;b\n1;2\n".into(),
            String::new(),
        ];
        for text in &texts {
            for chunk in [1, 3, 64 * 1024] {
                let d = if text.starts_with("a;") { b';' } else { b',' };
                let (reference, ours) = both(text.as_bytes(), d, chunk);
                assert_eq!(ours, reference, "{text:?} in chunks of {chunk}");
            }
        }
    }

    /// Reads `text` whole, `chunk` bytes a read: the records, or the bad byte.
    fn read_all(text: &[u8], chunk: usize) -> Result<Vec<Vec<Vec<u8>>>, BadByte> {
        let mut records = Records::default();
        let source = Box::new(std::io::Cursor::new(text.to_vec()).take(u64::MAX));
        let result = (|| {
            records.open(Box::new(Chunks(source, chunk)))?;
            records.records(b',');
            let mut rec = Record::default();
            let mut all = Vec::new();
            while records.read(&mut rec)? {
                all.push(rec.iter().map(<[u8]>::to_vec).collect());
            }
            Ok(all)
        })();
        result.map_err(|e: std::io::Error| bad_byte_of(&e).expect("a bad byte"))
    }

    /// At most so many bytes a read.
    struct Chunks(Box<dyn Read>, usize);
    impl Read for Chunks {
        fn read(&mut self, buf: &mut [u8]) -> std::io::Result<usize> {
            let n = self.1.min(buf.len());
            self.0.read(&mut buf[..n])
        }
    }

    /// A bad byte is found with its line and column (in characters) however the file
    /// arrives, a character split between two reads is not one, and a character cut
    /// off by the end of the file is. The byte-order mark is left out (not a column).
    #[test]
    fn utf8_checked_as_it_arrives() {
        let good = "\u{FEFF}a,b\n# \u{e9}t\u{e9}\nx\u{20ac},y\n".as_bytes();
        let bad_bytes = b"a,b\n\xC3\xA9,x\n\xC3\xA9\xC3\xA9,\xFF\n";
        for chunk in [1, 2, 3, 5, 64 * 1024] {
            let records = read_all(good, chunk).unwrap();
            assert_eq!(records[0], [b"a".to_vec(), b"b".to_vec()], "{chunk}");
            assert_eq!(records[1][0], "x\u{20ac}".as_bytes(), "{chunk}");
            assert_eq!(
                read_all(bad_bytes, chunk),
                Err(BadByte {
                    line: 3,
                    column: 4,
                    byte: 0xFF
                }),
                "{chunk}"
            );
            assert_eq!(
                read_all(b"a\n\xC3", chunk),
                Err(BadByte {
                    line: 2,
                    column: 1,
                    byte: 0xC3
                }),
                "{chunk}"
            );
        }
    }

    #[test]
    fn a_record_gives_its_fields() {
        let r = Record::from_fields(&["ab", "", "c"]);
        assert_eq!(r.len(), 3);
        assert_eq!(r.get(0), Some(&b"ab"[..]));
        assert_eq!(r.get(1), Some(&b""[..]));
        assert_eq!(r.get(2), Some(&b"c"[..]));
        assert_eq!(r.get(3), None);
        assert_eq!(r.as_slice(), b"abc");
        assert_eq!(r.with_field(b"d").len(), 4);
        assert!(Record::from_fields::<&str>(&[]).as_slice().is_empty());
    }
}
