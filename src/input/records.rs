//! Survey records straight from csv-core, the csv crate's own parser: the crate's
//! record layer (its `ByteRecord` and buffered reader) does the same for any file, and
//! costs about a tenth of a fleet's reading time on top of the parser.
//!
//! Nothing here splits CSV: csv-core does, into a record's field bytes and field ends,
//! exactly as the csv crate would with the same settings. This only gives it the file
//! a buffer at a time, makes room when a record outgrows its buffers, and keeps the
//! line a record starts on as the csv crate counts it (the parser's line count before
//! the record is read).

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

/// The records of one file after another, through one parser and one buffer.
pub struct Records {
    core: csv_core::Reader,
    source: Box<dyn Read>,
    buffer: Box<[u8]>,
    /// The unread bytes of `buffer`.
    start: usize,
    end: usize,
    /// The parser has said the file is over.
    done: bool,
}

impl Records {
    /// Records separated by `delimiter`, `#` starting a comment line, quotes as the csv
    /// crate reads them by default; with nothing to read yet.
    pub fn new(delimiter: u8) -> Self {
        Records {
            core: csv_core::ReaderBuilder::new()
                .delimiter(delimiter)
                .comment(Some(b'#'))
                .build(),
            source: Box::new(std::io::empty()),
            buffer: vec![0; READ_BUFFER].into_boxed_slice(),
            start: 0,
            end: 0,
            done: false,
        }
    }

    /// Reads `source` from its first byte next (the parser's state and line count
    /// reset, the buffer emptied).
    pub fn restart(&mut self, source: Box<dyn Read>) {
        self.core.reset();
        self.source = source;
        self.start = 0;
        self.end = 0;
        self.done = false;
    }

    /// Lets go of the source (the file is closed), keeping the parser and buffer.
    pub fn release(&mut self) {
        self.source = Box::new(std::io::empty());
    }

    /// The next record into `record`, or false at the end of the file.
    #[inline(always)]
    pub fn read(&mut self, record: &mut Record) -> std::io::Result<bool> {
        record.len = 0;
        record.line = self.core.line();
        if self.done {
            return Ok(false);
        }
        let (mut out, mut ends) = (0, 0);
        loop {
            if self.start == self.end {
                self.fill()?;
            }
            let (result, nin, nout, nend) = self.core.read_record(
                &self.buffer[self.start..self.end],
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

    /// The next bytes of the file into the buffer (none at its end).
    #[inline(never)]
    fn fill(&mut self) -> std::io::Result<()> {
        self.end = loop {
            match self.source.read(&mut self.buffer) {
                Err(e) if e.kind() == std::io::ErrorKind::Interrupted => continue,
                r => break r?,
            }
        };
        self.start = 0;
        Ok(())
    }
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
        let mut records = Records::new(delimiter);
        // (Used once for other text first: a restart must forget it.)
        records.restart(Box::new(std::io::Cursor::new(b"\"open,\n".to_vec())));
        let mut rec = Record::default();
        while records.read(&mut rec).unwrap() {}
        records.restart(Box::new(Trickle(text.to_vec(), 0, chunk)));
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
