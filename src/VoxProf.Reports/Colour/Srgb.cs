namespace VoxProf.Reports.Colour;

/// <summary>The sRGB transfer function of IEC 61966-2-1 between linear light and encoded values, both in [0, 1].</summary>
public static class Srgb
{
    public static double Encode(double linear) =>
        linear <= 0.0031308 ? 12.92 * linear : 1.055 * Math.Pow(linear, 1.0 / 2.4) - 0.055;

    public static double Decode(double encoded) =>
        encoded <= 0.04045 ? encoded / 12.92 : Math.Pow((encoded + 0.055) / 1.055, 2.4);

    /// <summary>Linear light to an 8-bit code, clamped and rounded to nearest.</summary>
    public static byte ToByte(double linear) => (byte)Math.Round(Math.Clamp(Encode(Math.Clamp(linear, 0, 1)), 0, 1) * 255);

    public static double FromByte(byte code) => Decode(code / 255.0);
}
