//! The guided walk for technicians and new hires: one safe step at a time,
//! from the complaint to a conclusion with the numbers.

#[allow(clippy::module_inception)]
mod guide;
mod guide_session;
mod question;

pub use guide::{Guide, Step};
pub use guide_session::{GuideSession, SessionError};
pub use question::Question;
