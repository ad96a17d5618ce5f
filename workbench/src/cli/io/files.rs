//! Files in and out: the one way the commands load a description, and safe writes.
//!
//! Every output file is written atomically: into a temporary file in the destination's own
//! directory, flushed to disk, then renamed over the destination. A reader, a kill, a full disk
//! or a second writer never leaves a truncated or mixed file: the old content stays until the
//! new one is complete. An output may never be one of the command's inputs (compared after
//! resolving symlinks). `-` and `/dev/stdout` mean standard output; a destination that is not
//! a regular file (a device, a pipe) is written directly and never read.

use std::fs::File;
use std::io::Write;
use std::path::{Path, PathBuf};

use armforge_compiler::classify::{classify, Geometry, Tolerances};
use armforge_compiler::description;
use armforge_compiler::diagnostics::Warnings;
use armforge_compiler::model::Model;
use armforge_compiler::pipeline::{display_path, read_description, PipelineError};

use super::exit;
use super::terminal::{fail, out, say, Stopped};

/// A description as loaded: the text (for reports that quote it) and the model.
pub struct Loaded {
    /// The file's text.
    pub text: String,
    /// The arm's model (SI units).
    pub model: Model,
}

/// The path as the user wrote it, for messages (see [`display_path`]).
pub fn shown(path: &Path) -> String {
    display_path(&path.to_string_lossy())
}

/// Reads and loads the description at `path`; on failure says why and gives the exit code.
pub fn load(path: &Path) -> Result<Loaded, Stopped> {
    let shown = shown(path);
    let text = read_description(path, &shown).map_err(|e| report(&e))?;
    let (model, warnings) = description::load_str_with_warnings(&text, &shown)
        .map_err(|d| report(&PipelineError::Description(d)))?;
    warn(&warnings);
    // (`pipeline::load_model` is the same without the text, which `inspect` quotes.)
    Ok(Loaded { text, model })
}

/// Loads and classifies the arm at `path` with the default tolerances; on failure says why and
/// gives the exit code. Warnings about the description go to stderr.
pub fn load_classified(path: &Path) -> Result<(Model, Geometry), Stopped> {
    let Loaded { model, .. } = load(path)?;
    let geometry = classify(&model, &Tolerances::default())
        .map_err(|r| report_at(&PipelineError::Rejected(Box::new(r)), path))?;
    Ok((model, geometry))
}

/// Shows the description's warnings on stderr (nothing when there are none).
pub fn warn(warnings: &Warnings) {
    if !warnings.is_empty() {
        say(&warnings.to_string());
    }
}

/// [`report`] for the description at `path`: a rejection also shows the offending line of the
/// file with a caret, as `inspect` does.
pub fn report_at(e: &PipelineError, path: &Path) -> Stopped {
    if let PipelineError::Rejected(r) = e {
        if let Ok(text) = read_description(path, &shown(path)) {
            say(&armforge_workbench::report::rejection_text(r, &text));
            return exit::of_pipeline(e);
        }
    }
    report(e)
}

/// Says what is wrong and gives the exit code of a pipeline error.
pub fn report(e: &PipelineError) -> Stopped {
    say(&e.to_string());
    exit::of_pipeline(e)
}

/// Reads a small input file other than a description (a pose) as UTF-8, at most `cap` bytes.
pub fn read_small(path: &Path, cap: u64) -> Result<String, String> {
    use std::io::Read;
    let shown = shown(path);
    let mut bytes = Vec::new();
    File::open(path)
        .and_then(|f| f.take(cap + 1).read_to_end(&mut bytes))
        .map_err(|e| format!("cannot read {shown}: {e}"))?;
    if bytes.len() as u64 > cap {
        return Err(format!("{shown} is larger than {cap} bytes"));
    }
    String::from_utf8(bytes).map_err(|e| {
        format!(
            "{shown} is not UTF-8 text (byte {} starts no character)",
            e.utf8_error().valid_up_to()
        )
    })
}

/// Where an output goes.
#[derive(Debug, PartialEq, Eq)]
pub enum Destination {
    /// Standard output (`-` or `/dev/stdout`).
    Stdout,
    /// A path; for an existing path, after resolving symlinks.
    Path(PathBuf),
}

impl Destination {
    /// The destination named by `path`.
    pub fn of(path: &Path) -> Destination {
        if path.as_os_str() == "-" || path == Path::new("/dev/stdout") {
            return Destination::Stdout;
        }
        Destination::Path(resolved(path))
    }
}

/// `path` with symlinks resolved: the file itself when it exists, otherwise its resolved
/// directory and its name (the path as given when neither resolves).
fn resolved(path: &Path) -> PathBuf {
    if let Ok(real) = path.canonicalize() {
        return real;
    }
    let parent = match path.parent() {
        Some(p) if !p.as_os_str().is_empty() => p,
        _ => Path::new("."),
    };
    match (parent.canonicalize(), path.file_name()) {
        (Ok(dir), Some(name)) => dir.join(name),
        _ => path.to_path_buf(),
    }
}

/// Refuses (with a message and [`exit::IO`]) when the output `path` is one of `inputs`.
pub fn refuse_inputs(path: &Path, inputs: &[&Path]) -> Result<(), Stopped> {
    let Destination::Path(target) = Destination::of(path) else {
        return Ok(());
    };
    match inputs.iter().find(|input| resolved(input) == target) {
        Some(input) => Err(fail(
            exit::IO,
            &format!(
                "the output {} is the input {}; choose another output file",
                shown(path),
                shown(input)
            ),
        )),
        None => Ok(()),
    }
}

/// What [`write`] did.
#[derive(Debug, PartialEq, Eq)]
pub enum Written {
    /// The text went to standard output or to a file.
    Written,
    /// The file already held exactly this text and was left alone.
    Unchanged,
}

/// Whether [`write`] may replace an existing file.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Replace {
    /// Replace it.
    Yes,
    /// Replace it only when its content differs (no new timestamp for build tools).
    IfChanged,
    /// Never: an existing file is an error.
    No,
}

/// Writes `text` to `path` (see the module doc) unless `path` is one of `inputs`; says
/// `wrote PATH` for a file, and on failure says why and gives [`exit::IO`].
pub fn write(
    path: &Path,
    text: &str,
    inputs: &[&Path],
    replace: Replace,
) -> Result<Written, Stopped> {
    refuse_inputs(path, inputs)?;
    let target = match Destination::of(path) {
        Destination::Stdout => return out(text).map(|()| Written::Written),
        Destination::Path(target) => target,
    };
    let shown = shown(path);
    let cannot = |e: std::io::Error| fail(exit::IO, &format!("cannot write {shown}: {e}"));
    match std::fs::metadata(&target) {
        Ok(meta) if !meta.is_file() => {
            // A device or a pipe: written in place, never read, never renamed over.
            let mut file = std::fs::OpenOptions::new()
                .write(true)
                .open(&target)
                .map_err(cannot)?;
            file.write_all(text.as_bytes())
                .and_then(|()| file.flush())
                .map_err(cannot)?;
            return Ok(Written::Written);
        }
        Ok(_) if replace == Replace::No => {
            return Err(fail(
                exit::USAGE,
                &format!("{shown} exists; pass --force to replace it"),
            ))
        }
        Ok(meta) if replace == Replace::IfChanged && same_content(&target, meta.len(), text) => {
            say(&format!("{shown} is up to date"));
            return Ok(Written::Unchanged);
        }
        _ => {}
    }
    atomic_write(&target, text.as_bytes(), replace == Replace::No).map_err(cannot)?;
    say(&format!("wrote {shown}"));
    Ok(Written::Written)
}

/// True when the regular file at `target` (of `len` bytes) holds exactly `text`.
fn same_content(target: &Path, len: u64, text: &str) -> bool {
    len == text.len() as u64 && std::fs::read(target).is_ok_and(|old| old == text.as_bytes())
}

/// Writes `bytes` into a temporary file beside `target`, syncs it and renames it over
/// `target` (or, with `no_clobber`, fails if `target` appeared meanwhile). An existing file's
/// permissions are kept.
fn atomic_write(target: &Path, bytes: &[u8], no_clobber: bool) -> std::io::Result<()> {
    let dir = match target.parent() {
        Some(p) if !p.as_os_str().is_empty() => p,
        _ => Path::new("."),
    };
    let name = target
        .file_name()
        .map(|n| n.to_string_lossy().into_owned())
        .unwrap_or_default();
    let mut temp = tempfile::Builder::new()
        .prefix(&format!(".{name}."))
        .suffix(".tmp")
        .tempfile_in(dir)?;
    temp.write_all(bytes)?;
    temp.flush()?;
    let permissions = match std::fs::metadata(target) {
        Ok(meta) => Some(meta.permissions()),
        Err(_) => new_file_permissions(),
    };
    if let Some(permissions) = permissions {
        temp.as_file().set_permissions(permissions)?;
    }
    temp.as_file().sync_all()?;
    if no_clobber {
        temp.persist_noclobber(target).map_err(|e| e.error)?;
    } else {
        temp.persist(target).map_err(|e| e.error)?;
    }
    // Make the rename itself durable; a directory that cannot be synced changes nothing.
    if let Ok(d) = File::open(dir) {
        let _ = d.sync_all();
    }
    Ok(())
}

/// The permissions of a newly created file: 0644 on Unix (a temporary file starts at 0600);
/// elsewhere whatever the temporary file got.
fn new_file_permissions() -> Option<std::fs::Permissions> {
    #[cfg(unix)]
    {
        use std::os::unix::fs::PermissionsExt;
        Some(std::fs::Permissions::from_mode(0o644))
    }
    #[cfg(not(unix))]
    {
        None
    }
}
