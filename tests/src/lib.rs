//! Published check values (filled below).
