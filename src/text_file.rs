//! Reading a user's text file (a profile, a readings file, a diagnosis in
//! JSON, a guide session) with a size bound, so a wrong file chosen by
//! mistake is refused instead of read whole into memory.

use std::io::Read;
use std::path::Path;

/// The largest text file read as input (1 MiB): far above any hand-written
/// profile, readings file or saved session.
pub const MAX_INPUT_BYTES: u64 = 1 << 20;

/// The file's text: at most [`MAX_INPUT_BYTES`], UTF-8. A larger file or one
/// that is not text is an `InvalidData` error saying so.
pub fn read_text(path: &Path) -> std::io::Result<String> {
    let invalid = |message: String| std::io::Error::new(std::io::ErrorKind::InvalidData, message);
    let mut bytes = Vec::new();
    std::fs::File::open(path)?
        .take(MAX_INPUT_BYTES + 1)
        .read_to_end(&mut bytes)?;
    if bytes.len() as u64 > MAX_INPUT_BYTES {
        return Err(invalid(format!(
            "the file is larger than the limit of {MAX_INPUT_BYTES} bytes"
        )));
    }
    String::from_utf8(bytes).map_err(|e| {
        invalid(format!(
            "the file is not UTF-8 text (at byte {})",
            e.utf8_error().valid_up_to()
        ))
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn big_and_binary_files_are_refused() {
        let dir = tempfile::tempdir().unwrap();
        let big = dir.path().join("big.yaml");
        std::fs::write(&big, vec![b'a'; (MAX_INPUT_BYTES + 1) as usize]).unwrap();
        assert_eq!(
            read_text(&big).unwrap_err().to_string(),
            "the file is larger than the limit of 1048576 bytes"
        );
        let latin = dir.path().join("latin.yaml");
        std::fs::write(&latin, b"bore: 4\xB0 in").unwrap();
        assert_eq!(
            read_text(&latin).unwrap_err().to_string(),
            "the file is not UTF-8 text (at byte 7)"
        );
        let ok = dir.path().join("ok.yaml");
        std::fs::write(&ok, "bore: 100 mm\n").unwrap();
        assert_eq!(read_text(&ok).unwrap(), "bore: 100 mm\n");
    }
}
