//! The subcommands of the `ramsift` binary, one file each, and what they share.

pub mod bounds;
pub mod demo;
pub mod draw;
pub mod encode;
pub mod enumerate;
pub mod find;
pub mod input;
pub mod instance_args;
pub mod progress;
pub mod record;
pub mod refute;
pub mod scan;
pub mod shard;
