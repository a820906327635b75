namespace BatchReconcile.Digest.Model;

/// <summary>The production day a digest covers, with its bounds on the plant clock.</summary>
/// <param name="Day">The production day's date on the plant clock.</param>
/// <param name="TimeZoneId">The plant time zone (IANA id), as the site settings name it.</param>
/// <param name="Start">First moment of the day (inclusive).</param>
/// <param name="End">First moment of the next day (exclusive).</param>
/// <remarks>The day is 23 or 25 hours long on the nights the clocks change, so its length is never assumed.</remarks>
public sealed record DigestDay(DateOnly Day, string TimeZoneId, DateTimeOffset Start, DateTimeOffset End)
{
    public string TimeZoneId { get; } = string.IsNullOrWhiteSpace(TimeZoneId)
        ? throw new ArgumentException("The plant time zone is required.", nameof(TimeZoneId))
        : TimeZoneId;

    public DateTimeOffset End { get; } = End > Start
        ? End
        : throw new ArgumentException($"The day must end after it starts ({Start:O} .. {End:O}).", nameof(End));

    /// <summary>The day's length: 24 hours, or 23 / 25 (other offsets in a few zones) across a clock change.</summary>
    public TimeSpan Length => End - Start;
}
