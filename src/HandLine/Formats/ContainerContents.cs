namespace HandLine.Formats;

/// <summary>
/// What a <see cref="ContainerFile"/> holds, handed to the kind's parser: the JSON header's bytes and a reader
/// positioned at the payload, which the parser must read to its end (<see cref="PayloadLength"/> bytes).
/// </summary>
public sealed record ContainerContents(byte[] Header, BinaryReader Payload, long PayloadLength);
