"""Writes the small test images of test/fixtures/images/ with Pillow (Debian's python3-pil), once,
and prints each file's format and size as Pillow reads them back: the reference the image-header
tests (test/read/publisher-logo.test.ts) compare against.

Run: /usr/bin/python3 test/reference/make-logo-images.py
"""
from pathlib import Path

from PIL import Image, ImageDraw

out = Path(__file__).resolve().parent.parent / 'fixtures' / 'images'
out.mkdir(parents=True, exist_ok=True)


def logo(width, height, mode='RGB'):
    image = Image.new(mode, (width, height), (0, 0, 0, 0) if mode == 'RGBA' else (29, 93, 122))
    draw = ImageDraw.Draw(image)
    draw.rectangle((width // 12, height // 5, width // 2.4, height - height // 5), fill=(255, 255, 255))
    draw.ellipse((width * 0.6, height * 0.15, width * 0.6 + height * 0.7, height * 0.85), fill=(224, 176, 64))
    return image


base = logo(120, 48)
base.save(out / 'logo-120x48.png', optimize=True)
base.save(out / 'logo-120x48.jpg', quality=85)
base.save(out / 'logo-120x48-progressive.jpg', quality=85, progressive=True)
base.save(out / 'logo-120x48-lossy.webp', quality=80)
base.save(out / 'logo-120x48-lossless.webp', lossless=True)
logo(96, 40, 'RGBA').save(out / 'logo-96x40-alpha.webp', quality=80)
Image.new('RGB', (2400, 12), (29, 93, 122)).save(out / 'wide-2400x12.png', optimize=True)

for path in sorted(out.iterdir()):
    with Image.open(path) as image:
        print(f'{path.name}: {image.format} {image.size[0]} x {image.size[1]}, {path.stat().st_size} bytes')
